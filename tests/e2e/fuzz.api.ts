/**
 * Fuzz test of every write route against the running app (the production build the e2e
 * suite starts). The routes come from the files under app/api (every exported POST, PUT,
 * PATCH, DELETE); each has a valid example body and its shared zod schema, and the
 * malformed requests are generated from them with a seeded random generator: fields set
 * to wrong types, huge or malformed numbers, NUL and lone surrogates, overlong text, bad
 * UUIDs and dates, deep nesting, missing fields, bodies that are not objects, invalid
 * JSON, wrong content types, oversized bodies and malformed ids in the path. A generated
 * body is kept only when the route's own schema refuses it, so every request is malformed.
 *
 * What must hold (issue 9, "Bad input never reaches the database or freezes the server"):
 * no response is 5xx; every 4xx names a field (or the body) in `error.issues`; and the
 * row count of every table is the same afterwards.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { expect, test, type APIRequestContext, type APIResponse } from "@playwright/test";
import pg from "pg";
import { z } from "zod";
import {
  adjustAmountSchema,
  availabilityInputSchema,
  chemicalInputSchema,
  chemicalUpdateSchema,
  consumeInputSchema,
  containerInputSchema,
  containerUpdateSchema,
  IMPORT_BODY_LIMIT,
  importRequestSchema,
  locationInputSchema,
  releaseInputSchema,
  reserveInputSchema,
} from "../../inventory/schemas";
import { acceptInvitationSchema, changePasswordSchema, changeRoleSchema, inviteMemberSchema } from "../../lib/members/schemas";
import { createApiTokenSchema } from "../../lib/api-tokens/schemas";
import { settingsUpdateSchema } from "../../lib/lab-settings/schemas";
import { planCreateSchema, planDuplicateSchema, planUpdateSchema } from "../../lib/plans/schemas";
import { planReviewSchema } from "../../lib/plans/review-schemas";
import { planPreviewSchema } from "../../lib/plans/preview";
import { safeDesignRequestSchema } from "../../lib/plans/safe-design";
import { studyCreateSchema, studyUpdateSchema } from "../../lib/studies/schemas";
import { exclusionCreateSchema, RESULTS_BODY_LIMIT, resultsCsvSchema, resultsPutSchema } from "../../lib/results/schemas";
import { DEMO, DEMO_PASSWORD } from "./support/auth";

const LAB = "kestrel-bay";
/** How many generated requests each route gets (27 routes today → about 1900 requests). */
const PER_ROUTE = 70;
const SEED = 20261202;

type Method = "POST" | "PUT" | "PATCH" | "DELETE";
interface RouteSpec {
  /** The route's folder under app/api, e.g. "labs/[lab]/chemicals/[chemicalId]". */
  route: string;
  method: Method;
  /** "json" bodies are checked against `schema`; "multipart" is the SDS upload; "none" takes no body; "auth" is next-auth's sign-in. */
  body: "json" | "multipart" | "none" | "auth";
  schema?: z.ZodType;
  /** A valid body (never sent as it is). */
  example?: () => unknown;
  /** Harmless values for the path parameters. */
  params: Record<string, string>;
  /** The route's body cap when it is not the default 1 MB (lib/api/route.ts). */
  maxBytes?: number;
  /** Who sends the requests when the lab admin's role may not reach the route's checks (default: the lab admin). */
  as?: "safety";
}

/** Every exported write handler under app/api, as "METHOD route". */
function writeRoutesOnDisk(): string[] {
  const root = join(process.cwd(), "app/api");
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (name === "route.ts") {
        const src = readFileSync(p, "utf8");
        for (const m of src.matchAll(/export\s+(?:const|async function)\s+(POST|PUT|PATCH|DELETE)\b/g)) out.push(`${m[1]} ${relative(root, dir)}`);
      }
    }
  };
  walk(root);
  return out.sort();
}

/** mulberry32: a small seeded generator, so a failure can be replayed. */
function rng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return { next, int: (n: number) => Math.floor(next() * n), pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]! };
}

const nested = (depth: number): unknown => (depth === 0 ? 1 : [nested(depth - 1)]);

/** Values that are wrong somewhere: wrong types, numbers a column cannot hold, text PostgreSQL cannot store. */
const BAD_VALUES: readonly unknown[] = [
  null, true, false, 0, -1, 1.5, 1e308, -1e308, 2 ** 64, [], {}, [[[]]], { $gt: "" }, nested(40),
  "", " ", "x".repeat(5000), "\u0000", "a\u0000b", "\ud800", "x\udfff", "\udc00\ud800",
  "1e10000000", "-1e10000000", "1e-10000000", "9".repeat(500), "1_000", "0x10", "NaN", "Infinity", "-0", "+", ".", "1e", "١٢٣",
  "not-a-uuid", "00000000-0000-0000-0000-00000000000g", "6d1c2a10-0000-4000-8000-000000000001' --", "' OR 1=1 --",
  "0000-01-01", "2026-02-30", "99999-12-31", "2026-13-01", "H999999999", "<script>alert(1)</script>", "\u202e", "🧪".repeat(300),
];
/** Path parameter values that cannot name a record. */
const BAD_IDS = ["not-a-uuid", "1%20OR%201%3D1", "00000000-0000-0000-0000-00000000000z", "%F0%9F%A7%AA", "x".repeat(300), "0b6f0c1e4a514c8e9d0a000000000001x"];
const BAD_SLUGS = ["Kestrel-Bay", "kestrel_bay", "-kestrel", "k%20b", "x".repeat(80)];

type JsonSchema = { type?: string | string[]; properties?: Record<string, JsonSchema>; items?: JsonSchema; anyOf?: JsonSchema[]; required?: string[] };

/** Every field path the schema describes (object properties, the first item of arrays). */
function fieldPaths(schema: JsonSchema, prefix: string[] = []): string[][] {
  const out: string[][] = [];
  if (prefix.length) out.push(prefix);
  for (const option of schema.anyOf ?? []) out.push(...fieldPaths(option, prefix).filter((p) => p.length > prefix.length));
  for (const [k, v] of Object.entries(schema.properties ?? {})) out.push(...fieldPaths(v, [...prefix, k]));
  if (schema.items) out.push(...fieldPaths(schema.items, [...prefix, "0"]));
  return out;
}

function setPath(target: unknown, path: string[], value: unknown, remove: boolean): unknown {
  const root = structuredClone(target) as Record<string, unknown>;
  let node: Record<string, unknown> = root;
  for (let i = 0; i < path.length - 1; i++) {
    const k = path[i]!;
    if (node[k] === null || typeof node[k] !== "object") node[k] = /^\d+$/.test(path[i + 1]!) ? [] : {};
    node = node[k] as Record<string, unknown>;
  }
  const last = path[path.length - 1]!;
  if (remove) delete node[last];
  else node[last] = value;
  return root;
}

interface Shot {
  spec: RouteSpec;
  kind: string;
  params: Record<string, string>;
  headers: Record<string, string>;
  data?: string | Buffer;
  multipart?: Record<string, string | { name: string; mimeType: string; buffer: Buffer }>;
}

/** One malformed request for `spec`, or null when the draw happened to be valid. */
function generate(spec: RouteSpec, r: ReturnType<typeof rng>): Shot | null {
  const json = { "content-type": "application/json" };
  const shot = (kind: string, data: string | Buffer | undefined, headers: Record<string, string> = json, params = spec.params): Shot => ({ spec, kind, params, headers, data });
  const example = spec.example?.();
  const exampleText = example === undefined ? "" : JSON.stringify(example);
  const roll = r.next();
  const paramNames = Object.keys(spec.params);

  if (spec.body === "auth") {
    const form = (email: string, password: string | null) => new URLSearchParams({ email, ...(password === null ? {} : { password }), csrfToken: "x", json: "true" }).toString();
    const email = r.pick(["", "not-an-email", `${"a".repeat(400)}@example.invalid`, "a\u0000@example.invalid", "\ud800@example.invalid", "@", "a@b"]);
    if (roll < 0.15) return shot("sign-in body too large", form("fuzz@example.invalid", "p".repeat(20_000)), { "content-type": "application/x-www-form-urlencoded" });
    if (roll < 0.3) return shot("sign-in as text/plain", form(email, "x"), { "content-type": "text/plain" });
    return shot("malformed sign-in", form(email, r.next() < 0.3 ? null : r.pick(["", "x".repeat(2000), "\u0000"])), { "content-type": "application/x-www-form-urlencoded" });
  }

  if (roll < 0.08 && paramNames.some((p) => p === "lab" || p.endsWith("Id") || p === "token")) {
    const name = r.pick(paramNames.filter((p) => p === "lab" || p.endsWith("Id") || p === "token"));
    const bad = name === "lab" ? r.pick(BAD_SLUGS) : name === "token" ? "x".repeat(300) : r.pick(BAD_IDS);
    return shot(`bad path ${name}`, spec.body === "json" ? exampleText : undefined, json, { ...spec.params, [name]: bad });
  }
  if (spec.body === "multipart") {
    if (roll < 0.3) return { spec, kind: "upload without a file", params: spec.params, headers: {}, multipart: { other: "x" } };
    if (roll < 0.55) return { spec, kind: "upload that is not a PDF", params: spec.params, headers: {}, multipart: { file: { name: "sheet.pdf", mimeType: "application/pdf", buffer: Buffer.from(r.pick(["<html>", "GIF89a", "%PDX-1.7", "\u0000\u0000"])) } } };
    if (roll < 0.7) return { spec, kind: "file field as text", params: spec.params, headers: {}, multipart: { file: "%PDF-1.7 not a file" } };
    if (roll < 0.85) return shot("upload as JSON", JSON.stringify({ file: "%PDF-1.7" }));
    return shot("upload with a broken multipart body", "--x\r\nContent-Disposition: form-data; name=\"file\"\r\n", { "content-type": "multipart/form-data; boundary=y" });
  }
  if (spec.body === "none") {
    const kinds = [
      () => shot("body as text/plain", '{"role":"viewer"}', { "content-type": "text/plain" }),
      () => shot("invalid JSON", "{\"a\":", json),
      () => shot("body too large", JSON.stringify({ pad: "p".repeat(1_100_000) })),
      () => shot("bad path id", undefined, json, { ...spec.params, [paramNames.find((p) => p.endsWith("Id"))!]: r.pick(BAD_IDS) }),
    ];
    return r.pick(kinds)();
  }
  // JSON routes
  if (roll < 0.15) return shot("valid body as text/plain (a cross-site form)", exampleText, { "content-type": r.pick(["text/plain", "application/x-www-form-urlencoded", "text/plain;charset=UTF-8"]) });
  if (roll < 0.2) return shot("invalid JSON", r.pick(["{\"a\":", "{'a':1}", "NaN", "{\"a\":1}}", "\u0000", "[1,]", "\"\\ud800"]));
  if (roll < 0.25) return shot("nested 100 levels", JSON.stringify({ ...(example as object), deep: nested(100) }));
  if (roll < 0.28) return shot("body too large", JSON.stringify({ ...(example as object), pad: "p".repeat((spec.maxBytes ?? 1_000_000) + 1000) }));
  if (roll < 0.33) return shot("NUL in a field name", JSON.stringify({ ...(example as object), "na\u0000me": 1 }));
  let body: unknown;
  let kind: string;
  if (roll < 0.38) {
    body = r.pick([[], null, 42, "text", true, [example]]);
    kind = "body is not an object";
  } else {
    const paths = fieldPaths(z.toJSONSchema(spec.schema!, { io: "input", unrepresentable: "any" }) as JsonSchema);
    body = example;
    const n = 1 + r.int(3);
    const changed: string[] = [];
    for (let i = 0; i < n; i++) {
      const path = r.pick(paths);
      const remove = r.next() < 0.15;
      body = setPath(body, path, remove ? undefined : r.pick(BAD_VALUES), remove);
      changed.push(`${remove ? "-" : ""}${path.join(".")}`);
    }
    kind = `fields ${changed.join(", ")}`;
  }
  if (spec.schema!.safeParse(body).success) return null; // not malformed after all: draw again
  return shot(kind, JSON.stringify(body));
}

function url(spec: RouteSpec, params: Record<string, string>): string {
  let path = spec.route.replace("[...nextauth]", "callback/credentials");
  for (const [k, v] of Object.entries(params)) path = path.replace(`[${k}]`, v.includes("%") ? v : encodeURIComponent(v));
  return `/api/${path}`;
}

async function tableCounts(client: pg.Client): Promise<Record<string, number>> {
  const { rows } = await client.query<{ tablename: string }>("SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename");
  const out: Record<string, number> = {};
  for (const { tablename } of rows) out[tablename] = Number((await client.query<{ n: string }>(`SELECT COUNT(*)::text AS n FROM "${tablename}"`)).rows[0]!.n);
  return out;
}

async function signIn(request: APIRequestContext, email: string) {
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await request.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: DEMO_PASSWORD, json: "true" } });
  expect(res.ok()).toBe(true);
}

test("fuzz: 1000+ malformed requests across every write route — no 5xx, every 4xx names a field, no table changes", async ({ request, playwright, baseURL }) => {
  test.setTimeout(240_000);
  await signIn(request, DEMO.admin);
  // The review route is for safety officers: a second session, so its own checks are reached.
  const safetyRequest = await playwright.request.newContext({ baseURL });
  await signIn(safetyRequest, DEMO.safety);
  const chemicals = (await (await request.get(`/api/labs/${LAB}/chemicals`)).json()) as { chemicals: Array<{ id: string; version: number }> };
  const containers = (await (await request.get(`/api/labs/${LAB}/containers?pageSize=5`)).json()) as { rows: Array<{ id: string; version: number }> };
  const members = (await (await request.get(`/api/labs/${LAB}/members`)).json()) as { members: Array<{ id: string; role: string }> };
  const chem = chemicals.chemicals[0]!;
  const box = containers.rows[0]!;
  const member = members.members.find((m) => m.role === "viewer")!;
  const randomId = "3f1e7c2a-9b4d-4e8f-a1c3-5d7e9f0b2c4a"; // matches no record
  const csv = "Name,CAS,Barcode,Amount,Unit\nWater,7732-18-5,FUZZ-1,1,L";

  const specs: RouteSpec[] = [
    { route: "account/password", method: "POST", body: "json", schema: changePasswordSchema, example: () => ({ currentPassword: "not-the-password", newPassword: "a-long-new-password", confirmPassword: "a-long-new-password" }), params: {} },
    { route: "auth/[...nextauth]", method: "POST", body: "auth", params: {} },
    { route: "invitations/[token]", method: "POST", body: "json", schema: acceptInvitationSchema, example: () => ({ name: "Fuzz", password: "a-long-password", confirmPassword: "a-long-password" }), params: { token: "Zm9vYmFyYmF6cXV4cXV1eHF1dXhxdXV4cXV1eHF1dXg" } },
    { route: "labs/[lab]/chemicals", method: "POST", body: "json", schema: chemicalInputSchema, example: () => ({ name: "Fuzzed reagent", synonyms: ["F"], cas: "7732-18-5", formula: "H2O", molarMass: "18.015", density: "1.000", physicalState: "liquid", ghsStatements: ["H319"], pyrophoric: false, waterReactive: false, peroxideClass: null, storageNotes: "n", lowStock: { amount: "1", unit: "L" } }), params: { lab: LAB } },
    { route: "labs/[lab]/chemicals/[chemicalId]", method: "PATCH", body: "json", schema: chemicalUpdateSchema, example: () => ({ storageNotes: "fuzz", molarMass: "18.015", ghsStatements: ["H319"], version: chem.version }), params: { lab: LAB, chemicalId: chem.id } },
    { route: "labs/[lab]/chemicals/[chemicalId]/sds", method: "POST", body: "multipart", params: { lab: LAB, chemicalId: chem.id } },
    { route: "labs/[lab]/containers", method: "POST", body: "json", schema: containerInputSchema, example: () => ({ chemicalId: chem.id, barcode: "FUZZ-NEW", lot: "L", locationId: null, amount: "5", unit: "g", purityPercent: "99.5", receivedOn: "2026-01-05", openedOn: "", expiresOn: "2028-01-01" }), params: { lab: LAB } },
    { route: "labs/[lab]/containers/[containerId]", method: "PATCH", body: "json", schema: containerUpdateSchema, example: () => ({ lot: "L9", expiresOn: "2028-01-01", status: "available", version: box.version }), params: { lab: LAB, containerId: box.id } },
    { route: "labs/[lab]/containers/[containerId]/adjust", method: "POST", body: "json", schema: adjustAmountSchema, example: () => ({ amount: "4", unit: "g", reason: "counted", version: box.version }), params: { lab: LAB, containerId: box.id } },
    { route: "labs/[lab]/containers/import", method: "POST", body: "json", schema: importRequestSchema, example: () => ({ csv, mapping: { name: "Name" } }), params: { lab: LAB }, maxBytes: IMPORT_BODY_LIMIT },
    { route: "labs/[lab]/containers/import/preview", method: "POST", body: "json", schema: importRequestSchema, example: () => ({ csv, mapping: { name: "Name" } }), params: { lab: LAB }, maxBytes: IMPORT_BODY_LIMIT },
    { route: "labs/[lab]/inventory/availability", method: "POST", body: "json", schema: availabilityInputSchema, example: () => ({ requirements: [{ chemicalId: chem.id, amount: "2", unit: "mmol", label: "base" }] }), params: { lab: LAB } },
    { route: "labs/[lab]/locations", method: "POST", body: "json", schema: locationInputSchema, example: () => ({ name: "Fuzz shelf", notes: "n" }), params: { lab: LAB } },
    { route: "labs/[lab]/members", method: "POST", body: "json", schema: inviteMemberSchema, example: () => ({ email: "fuzz@kestrelbay.example", role: "viewer" }), params: { lab: LAB } },
    { route: "labs/[lab]/members/[membershipId]", method: "PATCH", body: "json", schema: changeRoleSchema, example: () => ({ role: member.role }), params: { lab: LAB, membershipId: member.id } },
    // DELETE takes no body and the id is random: only the guards are exercised, never a removal.
    { route: "labs/[lab]/members/[membershipId]", method: "DELETE", body: "none", params: { lab: LAB, membershipId: randomId } },
    { route: "labs/[lab]/reservations", method: "POST", body: "json", schema: reserveInputSchema, example: () => ({ planRef: "fuzz-plan", note: "n", lines: [{ containerId: box.id, amount: "1", unit: "mg" }] }), params: { lab: LAB } },
    { route: "labs/[lab]/reservations/[reservationId]/consume", method: "POST", body: "json", schema: consumeInputSchema, example: () => ({ amount: "1", unit: "mg", note: "n" }), params: { lab: LAB, reservationId: randomId } },
    { route: "labs/[lab]/reservations/[reservationId]/release", method: "POST", body: "json", schema: releaseInputSchema, example: () => ({ reason: "not needed" }), params: { lab: LAB, reservationId: randomId } },
    { route: "labs/[lab]/tokens", method: "POST", body: "json", schema: createApiTokenSchema, example: () => ({ name: "Fuzz token", role: "viewer", expiresInDays: 7 }), params: { lab: LAB } },
    { route: "labs/[lab]/tokens/[tokenId]", method: "DELETE", body: "none", params: { lab: LAB, tokenId: randomId } },
    // Studies, plans and lab settings (issue 10): ids that match no record, so only refusals are exercised.
    { route: "labs/[lab]/studies", method: "POST", body: "json", schema: studyCreateSchema, example: () => ({ name: "Fuzz study", goal: "g", targetProduct: "t", responses: [{ name: "yield", unit: "%", goal: "target", target: 90, low: 80, high: 100 }] }), params: { lab: LAB } },
    { route: "labs/[lab]/studies/[studyId]", method: "PATCH", body: "json", schema: studyUpdateSchema, example: () => ({ version: 1, name: "Fuzz", responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), params: { lab: LAB, studyId: randomId } },
    { route: "labs/[lab]/studies/[studyId]", method: "DELETE", body: "none", params: { lab: LAB, studyId: randomId } },
    { route: "labs/[lab]/studies/[studyId]/plans", method: "POST", body: "json", schema: planCreateSchema, example: () => ({ document: { name: "Fuzz plan" } }), params: { lab: LAB, studyId: randomId } },
    { route: "labs/[lab]/plans/[planId]", method: "PUT", body: "json", schema: planUpdateSchema, example: () => ({ document: { name: "Fuzz plan" }, version: 1 }), params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/[planId]", method: "DELETE", body: "none", params: { lab: LAB, planId: randomId } },
    // The editor's live preview: writes nothing, so a malformed document is only ever refused.
    { route: "labs/[lab]/plans/preview", method: "POST", body: "json", schema: planPreviewSchema, example: () => ({ document: { name: "Fuzz preview" } }), params: { lab: LAB } },
    { route: "labs/[lab]/plans/[planId]/duplicate", method: "POST", body: "json", schema: planDuplicateSchema, example: () => ({ name: "Fuzz copy" }), params: { lab: LAB, planId: randomId } },
    // Review and release (issue 11): the moves take no body; the review is signed by a safety officer. Random plan ids: only refusals.
    { route: "labs/[lab]/plans/[planId]/submit", method: "POST", body: "none", params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/[planId]/review", method: "POST", body: "json", schema: planReviewSchema, example: () => ({ decision: "request_changes", comment: "Lower the top temperature.", password: "not-the-password" }), params: { lab: LAB, planId: randomId }, as: "safety" },
    { route: "labs/[lab]/plans/[planId]/release", method: "POST", body: "none", params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/[planId]/cancel", method: "POST", body: "none", params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/[planId]/start", method: "POST", body: "none", params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/alternatives", method: "POST", body: "json", schema: safeDesignRequestSchema, example: () => ({ document: { name: "Fuzz plan" }, kinds: ["face-centered"] }), params: { lab: LAB } },
    // Results and analysis (issue 12): a plan id that matches no record, so only refusals are exercised.
    { route: "labs/[lab]/plans/[planId]/results", method: "PUT", body: "json", schema: resultsPutSchema, example: () => ({ runs: [{ run: 1, responses: { yield: 72.1 } }, { run: 2, responses: null, reason: "vial cracked" }] }), params: { lab: LAB, planId: randomId }, maxBytes: RESULTS_BODY_LIMIT },
    { route: "labs/[lab]/plans/[planId]/results/preview", method: "POST", body: "json", schema: resultsCsvSchema, example: () => ({ csv: "Run,Yield\n1,72.1\n", mapping: { run: "Run", responses: { yield: "Yield" } } }), params: { lab: LAB, planId: randomId }, maxBytes: RESULTS_BODY_LIMIT },
    { route: "labs/[lab]/plans/[planId]/exclusions", method: "POST", body: "json", schema: exclusionCreateSchema, example: () => ({ run: 3, response: "yield", reason: "septum pierced twice" }), params: { lab: LAB, planId: randomId } },
    { route: "labs/[lab]/plans/[planId]/exclusions/[exclusionId]", method: "DELETE", body: "none", params: { lab: LAB, planId: randomId, exclusionId: randomId } },
    { route: "labs/[lab]/settings/[section]", method: "PUT", body: "json", schema: settingsUpdateSchema("dispensing"), example: () => ({ version: 1, value: { minPipetteVolumeUl: 10, overagePercent: 10, deadVolumeUl: 50, minWeighMassMg: 82, maxStockVolumeMl: 25, stockFillFraction: 0.8 } }), params: { lab: LAB, section: "dispensing" } },
  ];

  // The table covers every write route there is (a new route must be added here).
  expect(specs.map((s) => `${s.method} ${s.route}`).sort(), "every write route under app/api has a fuzz entry").toEqual(writeRoutesOnDisk());

  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const before = await tableCounts(client);
    const r = rng(SEED);
    const failures: string[] = [];
    const perRoute = new Map<string, number>();
    let sent = 0;
    const started = Date.now();
    for (const spec of specs) {
      for (let i = 0; i < PER_ROUTE; ) {
        const s = generate(spec, r);
        if (!s) continue;
        i++;
        const res: APIResponse = await (spec.as === "safety" ? safetyRequest : request).fetch(url(spec, s.params), { method: spec.method, headers: s.headers, data: s.data, multipart: s.multipart, maxRedirects: 0, failOnStatusCode: false });
        sent++;
        perRoute.set(`${spec.method} ${spec.route}`, (perRoute.get(`${spec.method} ${spec.route}`) ?? 0) + 1);
        const status = res.status();
        const where = `${spec.method} ${url(spec, s.params).slice(0, 90)} [${s.kind.slice(0, 120)}] → ${status}`;
        if (status >= 500) failures.push(`${where}: ${(await res.text()).slice(0, 200)}`);
        else if (status >= 400 && spec.body !== "auth") {
          const body = (await res.json().catch(() => null)) as { error?: { issues?: Array<{ path?: unknown; message?: unknown }> } } | null;
          const issues = body?.error?.issues ?? [];
          if (issues.length === 0 || !issues.every((x) => typeof x.path === "string" && typeof x.message === "string" && x.message !== "")) failures.push(`${where}: no field named: ${JSON.stringify(body).slice(0, 200)}`);
        } else if (status < 400 && spec.body !== "auth") failures.push(`${where}: a malformed request was accepted`);
      }
    }
    const seconds = (Date.now() - started) / 1000;
    console.log(`fuzz: ${sent} malformed requests over ${specs.length} write routes in ${seconds.toFixed(1)} s (seed ${SEED})`);
    expect(failures.slice(0, 25)).toEqual([]);
    expect(sent).toBeGreaterThanOrEqual(1000);
    for (const s of specs) expect(perRoute.get(`${s.method} ${s.route}`)).toBe(PER_ROUTE);
    expect(await tableCounts(client)).toEqual(before);
  } finally {
    await client.end();
    await safetyRequest.dispose();
  }
});
