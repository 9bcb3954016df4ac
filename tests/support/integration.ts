/**
 * Integration tests run against the real PostgreSQL test database that `npm test`
 * (scripts/test.mjs) creates, migrates and seeds with the demo data. Import from here:
 * it fails early with a clear message when DATABASE_URL is missing, and closes the pool.
 */
import { afterAll } from "vitest";
import { db } from "@/lib/server/db";
import "@/lib/server/models";

if (!process.env.DATABASE_URL) {
  throw new Error("Integration tests need DATABASE_URL: run them with `node scripts/test.mjs integration` (it sets up the test database).");
}
process.env.NEXTAUTH_SECRET ??= "integration-tests-secret-0123456789";

afterAll(async () => {
  await db().close();
  (globalThis as { tarelineSequelize?: unknown }).tarelineSequelize = undefined;
});

/** Seeded ids (seeders/20261201000100-demo-labs-and-members.cjs). */
export const SEED = {
  labs: { kestrel: { id: "0b6f0c1e-4a51-4c8e-9d0a-000000000001", slug: "kestrel-bay" }, harrow: { id: "0b6f0c1e-4a51-4c8e-9d0a-000000000002", slug: "harrow-fen" } },
  users: {
    chemist: { id: "6d1c2a10-0000-4000-8000-000000000001", email: "chemist@kestrelbay.example" },
    safety: { id: "6d1c2a10-0000-4000-8000-000000000002", email: "safety@kestrelbay.example" },
    stockkeeper: { id: "6d1c2a10-0000-4000-8000-000000000003", email: "stock@kestrelbay.example" },
    admin: { id: "6d1c2a10-0000-4000-8000-000000000004", email: "admin@kestrelbay.example" },
    viewer: { id: "6d1c2a10-0000-4000-8000-000000000005", email: "viewer@kestrelbay.example" },
    harrowChemist: { id: "6d1c2a10-0000-4000-8000-000000000006", email: "analyst@harrowfen.example" },
  },
  password: "tareline-demo",
} as const;

export { db };
