import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL(".", import.meta.url));

export default defineConfig({
  resolve: { alias: { "@": root, "server-only": `${root}tests/support/server-only.ts` } },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          // One PostgreSQL database is shared by the files: run them one at a time.
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: "bootstrap",
          // Runs `npm start` in a copy of the checkout (scripts/test.mjs runs it last).
          include: ["tests/bootstrap/**/*.test.ts"],
          environment: "node",
          testTimeout: 300_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
