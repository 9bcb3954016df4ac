/**
 * Bad input never reaches the database: every case is refused as invalid_input naming the
 * field the person typed, and no table changes. The limits come from the columns
 * (PostgreSQL documentation, "Numeric Types": NUMERIC(p, s) holds p digits, s of them
 * after the point — molar_mass NUMERIC(12,4) < 10^8, density NUMERIC(10,4) < 10^6,
 * purity_percent NUMERIC(6,3); BIGINT ≤ 9 223 372 036 854 775 807; "Date/Time Types": no
 * year 0; "Character Types": text cannot hold the NUL character) and from Unicode (a lone
 * surrogate is not a character; jsonb refuses one).
 */
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { AppError } from "@/lib/errors/app-error";
import { createChemical, listChemicals, updateChemical } from "@/inventory/server/chemicals";
import { createContainer, getContainer, updateContainer, adjustContainerAmount } from "@/inventory/server/containers";
import { reserveStock } from "@/inventory/server/reserve-stock";
import { createLocation } from "@/inventory/server/locations";
import { confirmImport, previewImport } from "@/inventory/server/import-containers";
import { inviteMember } from "@/lib/members/server/invite-member";

const LAB = SEED.labs.kestrel.id;
const KEEPER = SEED.users.stockkeeper.id;
const TABLES = ["chemicals", "containers", "locations", "reservations", "stock_ledger", "audit_log", "invitations"] as const;

async function rowCounts(): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) out[t] = Number((await db().query<{ n: string }>(`SELECT COUNT(*)::text AS n FROM ${t}`, { type: QueryTypes.SELECT }))[0]!.n);
  return out;
}

async function refusedPaths(p: Promise<unknown>): Promise<string[]> {
  const e = await p.then(
    () => null,
    (x: unknown) => x,
  );
  if (!(e instanceof AppError)) throw new Error(`expected an AppError, got ${e === null ? "success" : String(e)}`);
  expect(e.code).toBe("invalid_input");
  return e.issues.map((i) => i.path);
}

async function freshChemical(extra: Record<string, unknown> = {}) {
  return createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: `Bounds ${randomUUID().slice(0, 8)}`, ...extra } });
}

describe("numbers are bounded in the schema, before any exact arithmetic", () => {
  it("refuses each malformed or out-of-range number naming its field, and writes nothing", async () => {
    const chem = await freshChemical();
    const box = await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `BI-${randomUUID().slice(0, 8)}`, amount: "5", unit: "g" } });
    const before = await rowCounts();
    const cases: Array<[string, Promise<unknown>, string]> = [
      // A ten-million-digit exponent: refused by its text (three exponent digits at most), never expanded.
      ["1e10000000 g", reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "bounds", lines: [{ containerId: box.id, amount: "1e10000000", unit: "g" }] } }), "lines.0.amount"],
      ["1_000 mg", reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "bounds", lines: [{ containerId: box.id, amount: "1_000", unit: "mg" }] } }), "lines.0.amount"],
      ["0x10 g", reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "bounds", lines: [{ containerId: box.id, amount: "0x10", unit: "g" }] } }), "lines.0.amount"],
      // 10^10 kg = 10^19 µg: more than BIGINT holds (and than MAX_STOCK_BASE, 10^15 µg).
      ["10^10 kg received", createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `BI-${randomUUID().slice(0, 8)}`, amount: "10000000000", unit: "kg" } }), "amount"],
      ["adjust to 2e6 kg", adjustContainerAmount({ labId: LAB, actorUserId: KEEPER, containerId: box.id, input: { amount: "2e6", unit: "kg", reason: "counted" } }), "amount"],
      ["molar mass 1e8 (NUMERIC(12,4) holds < 10^8)", freshChemical({ molarMass: "1e8" }), "molarMass"],
      ["molar mass 1e-30 (rounds to 0 in NUMERIC(12,4))", freshChemical({ molarMass: "1e-30" }), "molarMass"],
      ["molar mass 180.15588 (five decimals; the column keeps four)", freshChemical({ molarMass: "180.15588" }), "molarMass"],
      ["density 1e6 (NUMERIC(10,4) holds < 10^6)", freshChemical({ density: 1e6 }), "density"],
      ["density Infinity as text", freshChemical({ density: "Infinity" }), "density"],
      ["purity 100.001 %", createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `BI-${randomUUID().slice(0, 8)}`, amount: "1", unit: "g", purityPercent: "100.001" } }), "purityPercent"],
      ["purity 0.0001 % (the column keeps three decimals)", createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `BI-${randomUUID().slice(0, 8)}`, amount: "1", unit: "g", purityPercent: "0.0001" } }), "purityPercent"],
      ["low-stock mark 1e20 kg", freshChemical({ lowStock: { amount: "1e20", unit: "kg" } }), "lowStock.amount"],
    ];
    for (const [label, p, path] of cases) expect(await refusedPaths(p), label).toEqual([path]);
    expect(await rowCounts()).toEqual(before);
  });

  it("keeps an accepted decimal exactly, in its canonical form", async () => {
    const chem = await freshChemical({ molarMass: "1.8015e2", density: 0.889 });
    const row = (await listChemicals({ labId: LAB })).find((c) => c.id === chem.id)!;
    // NUMERIC reads back with the column's scale: 180.15 → "180.1500", 0.889 → "0.8890".
    expect([row.molarMass, row.density]).toEqual(["180.1500", "0.8890"]);
  });
});

describe("dates are real calendar days of a sensible year", () => {
  it("refuses year 0000, 31 April and 29 February of a common year; accepts 29 February of a leap year", async () => {
    const chem = await freshChemical();
    const receive = (receivedOn: string) => createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `BD-${randomUUID().slice(0, 8)}`, amount: "1", unit: "g", receivedOn } });
    const before = await rowCounts();
    // Gregorian calendar: April has 30 days; 2027 is not a leap year (not divisible by 4), 2028 is.
    for (const d of ["0000-01-01", "2026-04-31", "2027-02-29", "20260-01-01", "2026-1-01"]) expect(await refusedPaths(receive(d)), d).toEqual(["receivedOn"]);
    expect(await rowCounts()).toEqual(before);
    const ok = await receive("2028-02-29");
    expect((await getContainer({ labId: LAB, containerId: ok.id })).receivedOn).toBe("2028-02-29");
  });
});

describe("text that PostgreSQL cannot store is refused, naming the field", () => {
  it("NUL and lone surrogates in any string field", async () => {
    const chem = await freshChemical();
    const before = await rowCounts();
    const cases: Array<[string, Promise<unknown>, string]> = [
      ["NUL in a chemical name", createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: "Water\u0000" } }), "name"],
      ["lone high surrogate in a synonym", createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: "Water", synonyms: ["ok", "bad\uD800"] } }), "synonyms.1"],
      ["lone low surrogate in storage notes", updateChemical({ labId: LAB, actorUserId: KEEPER, chemicalId: chem.id, input: { storageNotes: "\uDC00 shelf", version: chem.version } }), "storageNotes"],
      ["NUL in a location name", createLocation({ labId: LAB, actorUserId: KEEPER, input: { name: "Shelf\u00001" } }), "name"],
      ["NUL in a barcode", createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: "B\u0000", amount: "1", unit: "g" } }), "barcode"],
      ["lone surrogate in a plan reference", reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "p\uD83D", lines: [{ containerId: randomUUID(), amount: "1", unit: "g" }] } }), "planRef"],
      ["NUL in an e-mail", inviteMember({ labId: LAB, actorUserId: SEED.users.admin.id, appUrl: "http://127.0.0.1", input: { email: "a\u0000@kestrelbay.example", role: "viewer" } }), "email"],
    ];
    for (const [label, p, path] of cases) expect(await refusedPaths(p), label).toEqual([path]);
    expect(await rowCounts()).toEqual(before);
  });

  it("a proper surrogate pair (an emoji) is ordinary text", async () => {
    const chem = await freshChemical({ storageNotes: "Keep cold \u{1F9CA}" });
    expect((await listChemicals({ labId: LAB })).find((c) => c.id === chem.id)?.storageNotes).toBe("Keep cold \u{1F9CA}");
  });
});

describe("a partial PATCH changes only the fields sent", () => {
  it("a chemical's storage notes change; its GHS statements, flags, state, synonyms and marks stay as created", async () => {
    const created = {
      name: `Partial ${randomUUID().slice(0, 8)}`,
      synonyms: ["Oxolane", "THF"],
      formula: "C4H8O",
      molarMass: "72.11",
      density: "0.889",
      physicalState: "liquid",
      ghsStatements: ["H225", "H319", "EUH019"],
      pyrophoric: true,
      waterReactive: true,
      peroxideClass: "B",
      lowStock: { amount: "500", unit: "mL" },
    };
    const chem = await createChemical({ labId: LAB, actorUserId: KEEPER, input: created });
    const row = async () => (await listChemicals({ labId: LAB })).find((c) => c.id === chem.id)!;
    const before = await row();
    const r = await updateChemical({ labId: LAB, actorUserId: KEEPER, chemicalId: chem.id, input: { storageNotes: "Flammables cabinet, under nitrogen", version: chem.version } });
    expect(r.version).toBe(chem.version + 1);
    const after = await row();
    expect(after.storageNotes).toBe("Flammables cabinet, under nitrogen");
    const { storageNotes: _a, version: _va, ...restBefore } = before;
    const { storageNotes: _b, version: _vb, ...restAfter } = after;
    expect(restAfter).toEqual(restBefore);
    // And against what was sent, not only against the previous read:
    expect(after).toMatchObject({ synonyms: ["Oxolane", "THF"], physicalState: "liquid", ghsStatements: ["H225", "H319", "EUH019"], pyrophoric: true, waterReactive: true, peroxideClass: "B", molarMass: "72.1100" });
    expect(after.lowStock?.base).toBe("500000000"); // 500 mL = 5·10^8 nL
  });

  it("a container's lot changes; its location, dates and status stay", async () => {
    const chem = await freshChemical();
    const box = await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `PP-${randomUUID().slice(0, 8)}`, amount: "1", unit: "g", lot: "L1", receivedOn: "2026-01-05", openedOn: "2026-02-01", expiresOn: "2028-01-01" } });
    const before = await getContainer({ labId: LAB, containerId: box.id });
    await updateContainer({ labId: LAB, actorUserId: KEEPER, containerId: box.id, input: { lot: "L2", version: before.version } });
    const after = await getContainer({ labId: LAB, containerId: box.id });
    expect(after).toEqual({ ...before, lot: "L2", version: before.version + 1 });
  });
});

describe("optimistic versions", () => {
  it("two people edit the same chemical: the second, from the stale copy, gets a conflict naming version and changes nothing", async () => {
    const chem = await freshChemical();
    await updateChemical({ labId: LAB, actorUserId: KEEPER, chemicalId: chem.id, input: { storageNotes: "first", version: chem.version } });
    const err = await updateChemical({ labId: LAB, actorUserId: SEED.users.admin.id, chemicalId: chem.id, input: { storageNotes: "second", version: chem.version } }).catch((e: unknown) => e);
    expect((err as AppError).code).toBe("conflict");
    expect((err as AppError).issues.map((i) => i.path)).toEqual(["version"]);
    expect((await listChemicals({ labId: LAB })).find((c) => c.id === chem.id)?.storageNotes).toBe("first");
  });

  it("an edit without the version is refused naming version", async () => {
    const chem = await freshChemical();
    expect(await refusedPaths(updateChemical({ labId: LAB, actorUserId: KEEPER, chemicalId: chem.id, input: { storageNotes: "x" } }))).toEqual(["version"]);
  });

  it("a stock movement raises a container's version, so an edit from before it is refused", async () => {
    const chem = await freshChemical();
    const box = await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `PV-${randomUUID().slice(0, 8)}`, amount: "1", unit: "g" } });
    await adjustContainerAmount({ labId: LAB, actorUserId: KEEPER, containerId: box.id, input: { amount: "0.9", unit: "g", reason: "weighed" } });
    const err = await updateContainer({ labId: LAB, actorUserId: KEEPER, containerId: box.id, input: { status: "quarantined", version: box.version } }).catch((e: unknown) => e);
    expect((err as AppError).code).toBe("conflict");
    expect((err as AppError).issues[0]?.path).toBe("version");
    expect((await getContainer({ labId: LAB, containerId: box.id })).status).toBe("available");
  });
});

describe("CSV import: the preview runs exactly the import's checks", () => {
  it("rows that break a column's limit are refused by the preview, and the import refuses the same rows", async () => {
    const tag = randomUUID().slice(0, 6);
    const csv = [
      "Name,CAS,Barcode,Amount,Unit,Location,Lot,Molar mass,Purity,Received",
      `Long lot,7732-18-5,CL-${tag}-1,1,L,,${"L".repeat(65)},,,`,
      `Long shelf,7732-18-5,CL-${tag}-2,1,L,${"S".repeat(121)},,,,`,
      `Too much,7732-18-5,CL-${tag}-3,1e10,kg,,,,,`,
      `Heavy,64-17-5,CL-${tag}-4,1,L,,,1e9,,`,
      `Pure,64-17-5,CL-${tag}-5,1,L,,,,99.99999,`,
      `Old,64-17-5,CL-${tag}-6,1,L,,,,,0000-03-01`,
      `Grouped,64-17-5,CL-${tag}-7,1_000,mL,,,,,`,
    ].join("\n");
    const before = await rowCounts();
    const preview = await previewImport({ labId: LAB, input: { csv } });
    const expected = [
      [1, "Lot"],
      [2, "Location"],
      [3, "Amount"],
      [4, "Molar mass"],
      [5, "Purity"],
      [6, "Received"],
      [7, "Amount"],
    ];
    expect(preview.issues.map((i) => [i.row, i.column])).toEqual(expected);
    expect(preview.rows).toEqual([]);
    const err = await confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv } }).catch((e: unknown) => e);
    expect((err as AppError).code).toBe("invalid_input");
    expect((err as AppError).issues.map((i) => i.path)).toEqual(["rows.1.lot", "rows.2.location", "rows.3.amount", "rows.4.molar_mass", "rows.5.purity", "rows.6.received", "rows.7.amount"]);
    // A file with a NUL character anywhere is refused as a whole, naming the file.
    expect(await refusedPaths(previewImport({ labId: LAB, input: { csv: `${csv}\nNul,64-17-5,CL-${tag}-9\u0000,1,L,,,,,` } }))).toEqual(["csv"]);
    expect(await rowCounts()).toEqual(before);
  });

  it("every row the preview accepts, the import writes", async () => {
    const tag = randomUUID().slice(0, 6);
    // Each value sits at a column's limit: 64-character lot, 120-character location, four decimals of molar mass, three of purity.
    const csv = ["Name,CAS,Barcode,Amount,Unit,Location,Lot,Molar mass,Purity", `Edge ${tag},50-00-0,CE-${tag},2.5,L,${"E".repeat(114)}${tag},${"L".repeat(58)}${tag},30.0260,99.995`].join("\n");
    const preview = await previewImport({ labId: LAB, input: { csv } });
    expect(preview.issues).toEqual([]);
    expect(preview.rows).toHaveLength(1);
    expect((await confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv } })).imported).toBe(1);
  });
});
