/**
 * Helpers for the review and release integration tests: requests to the real route
 * handlers (the test file mocks only the session), plan documents from the demo's
 * Suzuki–Miyaura screen (examples/plan-suzuki.json) and chemicals and containers made
 * through the inventory's own operations, each test with names of its own.
 */
import { readFileSync } from "node:fs";
import { createChemical } from "@/inventory/server/chemicals";
import { createContainer } from "@/inventory/server/containers";
import { QueryTypes } from "sequelize";
import { SEED, db } from "./integration";

export type Json = Record<string, unknown>;
export const lab = SEED.labs.kestrel.slug;
export const LAB_ID = SEED.labs.kestrel.id;

/** The route context Next passes a handler (tests/support/fake-session.ts). */
export { routeCtx as ctx } from "./fake-session";
export const req = (method = "GET", body?: unknown) =>
  new Request("http://test.invalid/x", { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

export interface PlanJson {
  id: string;
  name: string;
  state: string;
  version: number;
  contentHash: string;
  document: Json & { recipe: Json & { components: Json[]; solvents: Json[] }; factors: Json[]; vessel: Json };
  runSheet: (Json & { runs: unknown[]; inventory: Array<{ kind: string; id: string; name: string; mmol: number | null; massMg: number | null; volumeUl: number | null }> }) | null;
  cautions: Array<{ code: string; severity: string; runs: number[] }>;
  releasable: boolean;
  signOffRequired: boolean;
  signature: { signerName: string; signedAt: string; meaning: string; contentHash: string; valid: boolean } | null;
  reservations: Array<{ id: string; containerId: string; chemicalId: string; status: string; amount: { base: string; display: string }; barcode: string }>;
}

export interface ErrorJson {
  error: { code: string; message: string; issues: Array<{ path: string; message: string }> };
  shortfalls?: Array<{ chemicalId: string; name: string; needed: number; available: number; unit: string }>;
}

/** The demo's screen plan (examples/plan-suzuki.json): 18 runs, 60–100 °C, no sign-off needed. */
export const suzuki = (): PlanJson["document"] => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as PlanJson["document"];

/** The screen up to 110 °C: sealed above 1,4-dioxane's boiling point (101 °C), so sign-off is required (TL-S03); nothing blocks. */
export function suzukiHot(): PlanJson["document"] {
  const d = suzuki();
  (d.factors[0] as Json).high = 110;
  return d;
}

/** The screen in a vessel rated 1.5 bar: the estimated pressure exceeds rating × safety factor, a blocking caution (TL-V02). */
export function suzukiUnderRated(): PlanJson["document"] {
  const d = suzuki();
  d.vessel = { ...d.vessel, ratedBar: 1.5 };
  return d;
}

/** Links components (by id) and solvents (by name) of `doc` to chemicals. */
export function linkChemicals(doc: PlanJson["document"], links: { components?: Record<string, string>; solvents?: Record<string, string> }): PlanJson["document"] {
  const d = structuredClone(doc);
  for (const c of d.recipe.components) if (links.components?.[c.id as string]) c.chemicalId = links.components[c.id as string];
  for (const s of d.recipe.solvents) if (links.solvents?.[s.name as string]) s.chemicalId = links.solvents[s.name as string];
  return d;
}

/** A chemical of the Kestrel Bay lab with containers, made by the stockkeeper through the inventory's operations. */
export async function stockedChemical(
  input: { name: string; molarMass?: string; density?: string; physicalState: "solid" | "liquid" | "solution" },
  containers: Array<{ barcode: string; amount: string; unit: string; expiresOn?: string; openedOn?: string; purityPercent?: string }>,
): Promise<{ chemicalId: string; containerIds: string[] }> {
  const keeper = SEED.users.stockkeeper.id;
  const chem = await createChemical({ labId: LAB_ID, actorUserId: keeper, input: { ghsStatements: [], ...input } });
  const ids: string[] = [];
  for (const c of containers) ids.push((await createContainer({ labId: LAB_ID, actorUserId: keeper, input: { chemicalId: chem.id, ...c } })).id);
  return { chemicalId: chem.id, containerIds: ids };
}

/** An ISO date `days` from today (UTC). */
export function daysFromToday(days: number): string {
  const d = new Date();
  d.setUTCHours(0, 0, 0, 0);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/**
 * ⌈x × 10^3⌉ computed exactly from the decimal text of x (no floating point): what the
 * inventory holds for x mg (in µg) or x µL (in nL), amounts being rounded up to whole base
 * units (inventory/units.ts).
 */
export function ceilThousandths(x: number): bigint {
  const s = String(x);
  if (/e/i.test(s)) throw new Error(`ceilThousandths: ${s} has an exponent`);
  const [int = "0", frac = ""] = s.split(".");
  const kept = BigInt(int + frac.slice(0, 3).padEnd(3, "0"));
  return /[1-9]/.test(frac.slice(3)) ? kept + 1n : kept;
}

/** The database's clock now (job rows are stamped by it). */
export async function databaseNow(): Promise<string> {
  const [row] = await db().query<{ now: string }>("SELECT now()::text AS now", { type: QueryTypes.SELECT });
  return row!.now;
}

/**
 * How many mail jobs queued since `since` are not done yet (pg-boss's job table). A file
 * that sends mail waits for none before stopping its SMTP capture, so no job of its own is
 * left retrying (and rendering its prep sheet) while later files run.
 */
export async function mailJobsPending(since: string): Promise<number> {
  const [row] = await db().query<{ n: string }>(
    "SELECT count(*)::text AS n FROM pgboss.job WHERE name = 'mail' AND created_on >= $since AND state NOT IN ('completed', 'failed', 'cancelled')",
    { bind: { since }, type: QueryTypes.SELECT },
  );
  return Number(row!.n);
}
