/**
 * Inventory against the real PostgreSQL test database (migrated and seeded by
 * `node scripts/test.mjs integration`). Each test makes its own chemical and containers
 * with unique barcodes, so tests do not depend on each other.
 */
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { AppError } from "@/lib/errors/app-error";
import { createChemical } from "@/inventory/server/chemicals";
import { createContainer, getContainer, listContainers, adjustContainerAmount } from "@/inventory/server/containers";
import { reserveStock } from "@/inventory/server/reserve-stock";
import { consumeReservation, releaseReservation, releaseReservationsForPlan } from "@/inventory/server/close-reservation";
import { containerLedger, listReservations } from "@/inventory/server/ledger";
import { checkAvailability } from "@/inventory/server/availability";
import { stockAlerts } from "@/inventory/server/stock-alerts";
import { getSafetyDataSheet, uploadSafetyDataSheet } from "@/inventory/server/safety-data-sheets";

const LAB = SEED.labs.kestrel.id;
const HARROW = SEED.labs.harrow.id;
const KEEPER = SEED.users.stockkeeper.id;

async function freshContainer(amount: string, unit: string, extra: Record<string, unknown> = {}) {
  const tag = randomUUID().slice(0, 8);
  const chem = await createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: `Test reagent ${tag}`, molarMass: "100.00", density: "1.200" } });
  const box = await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `IT-${tag}`, amount, unit, ...extra } });
  return { chemicalId: chem.id, containerId: box.id, barcode: `IT-${tag}` };
}

async function ledgerSums(containerId: string) {
  const [row] = await db().query<{ delta: string; held: string; n: string }>(
    "SELECT COALESCE(SUM(delta_base),0)::text AS delta, COALESCE(SUM(held_delta_base),0)::text AS held, COUNT(*)::text AS n FROM stock_ledger WHERE container_id = :id",
    { replacements: { id: containerId }, type: QueryTypes.SELECT },
  );
  const [res] = await db().query<{ held: string }>("SELECT COALESCE(SUM(amount_base),0)::text AS held FROM reservations WHERE container_id = :id AND status = 'held'", {
    replacements: { id: containerId },
    type: QueryTypes.SELECT,
  });
  const [box] = await db().query<{ amount: string }>("SELECT amount_base::text AS amount FROM containers WHERE id = :id", { replacements: { id: containerId }, type: QueryTypes.SELECT });
  return { ledgerAmount: BigInt(row!.delta), ledgerHeld: BigInt(row!.held), lines: Number(row!.n), reservedHeld: BigInt(res!.held), amount: BigInt(box!.amount) };
}

describe("reservations under concurrency", () => {
  it("50 concurrent requests for a container that can satisfy 10: exactly 10 succeed, ledger balances to the milligram", async () => {
    // 1.000 g in the container; each request asks 100 mg → at most 10 can be held.
    const { containerId } = await freshContainer("1.000", "g");
    const results = await Promise.allSettled(
      Array.from({ length: 50 }, (_, i) => reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: `concurrency-${i}`, lines: [{ containerId, amount: "100", unit: "mg" }] } })),
    );
    const ok = results.filter((r) => r.status === "fulfilled");
    const refused = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(ok).toHaveLength(10);
    expect(refused).toHaveLength(40);
    for (const r of refused) expect((r.reason as AppError).code).toBe("conflict");
    const s = await ledgerSums(containerId);
    // 1 received line + 10 reserved lines; amount unchanged; held = 10 × 100 mg = 1 g exactly (in µg).
    expect(s.lines).toBe(11);
    expect(s.ledgerAmount).toBe(1_000_000n);
    expect(s.amount).toBe(s.ledgerAmount);
    expect(s.ledgerHeld).toBe(1_000_000n);
    expect(s.reservedHeld).toBe(s.ledgerHeld);
    const view = await getContainer({ labId: LAB, containerId });
    expect(view.available.base).toBe("0");
  });

  it("all-or-nothing: a request with one line too large reserves nothing", async () => {
    const a = await freshContainer("10", "mL");
    const b = await freshContainer("1", "mL");
    await expect(
      reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "atomic", lines: [{ containerId: a.containerId, amount: "5", unit: "mL" }, { containerId: b.containerId, amount: "2", unit: "mL" }] } }),
    ).rejects.toMatchObject({ code: "conflict", issues: [{ path: "lines.1.amount" }] });
    expect((await ledgerSums(a.containerId)).reservedHeld).toBe(0n);
  });
});

describe("consume and release", () => {
  it("consume takes the amount used; the unused remainder is free again", async () => {
    const { containerId } = await freshContainer("5", "g");
    const [r] = await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "consume-test", lines: [{ containerId, amount: "2", unit: "g" }] } });
    await consumeReservation({ labId: LAB, actorUserId: KEEPER, reservationId: r!.id, input: { amount: "1.250", unit: "g" } });
    const view = await getContainer({ labId: LAB, containerId });
    // computed in this test: 5 g − 1.25 g used = 3.75 g; nothing held
    expect(view.amount.base).toBe("3750000");
    expect(view.held.base).toBe("0");
    expect(view.available.base).toBe("3750000");
    const s = await ledgerSums(containerId);
    expect(s.ledgerAmount).toBe(s.amount);
    expect(s.ledgerHeld).toBe(0n);
    await expect(consumeReservation({ labId: LAB, actorUserId: KEEPER, reservationId: r!.id, input: { amount: "1", unit: "g" } })).rejects.toMatchObject({ code: "conflict" });
  });

  it("release gives the whole reservation back; releasing a plan releases all its holds", async () => {
    const { containerId } = await freshContainer("100", "mL");
    const plan = randomUUID();
    const [one] = await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "release-one", lines: [{ containerId, amount: "10", unit: "mL" }] } });
    await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: plan, lines: [{ containerId, amount: "20", unit: "mL" }, { containerId, amount: "30", unit: "mL" }] } });
    expect((await getContainer({ labId: LAB, containerId })).available.base).toBe("40000000");
    await releaseReservation({ labId: LAB, actorUserId: KEEPER, reservationId: one!.id, input: { reason: "stale hold" } });
    expect(await releaseReservationsForPlan({ labId: LAB, actorUserId: KEEPER, planRef: plan })).toEqual({ released: 2 });
    expect(await releaseReservationsForPlan({ labId: LAB, actorUserId: KEEPER, planRef: plan })).toEqual({ released: 0 });
    const view = await getContainer({ labId: LAB, containerId });
    expect(view.amount.base).toBe("100000000");
    expect(view.available.base).toBe("100000000");
    expect((await listReservations({ labId: LAB, planRef: plan, status: "held" })).length).toBe(0);
    const ledger = await containerLedger({ labId: LAB, containerId });
    expect(ledger.map((l) => l.kind)).toEqual(["received", "reserved", "reserved", "reserved", "released", "released", "released"]);
  });

  it("an adjustment cannot go below what reservations hold", async () => {
    const { containerId } = await freshContainer("10", "g");
    await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: "adjust", lines: [{ containerId, amount: "4", unit: "g" }] } });
    await expect(adjustContainerAmount({ labId: LAB, actorUserId: KEEPER, containerId, input: { amount: "3", unit: "g", reason: "stock-take" } })).rejects.toMatchObject({ code: "conflict" });
    await adjustContainerAmount({ labId: LAB, actorUserId: KEEPER, containerId, input: { amount: "9.5", unit: "g", reason: "stock-take" } });
    const s = await ledgerSums(containerId);
    expect(s.amount).toBe(9_500_000n);
    expect(s.ledgerAmount).toBe(s.amount);
  });

  it("the ledger refuses UPDATE and DELETE", async () => {
    const { containerId } = await freshContainer("1", "g");
    await expect(db().query("UPDATE stock_ledger SET reason = 'x' WHERE container_id = :id", { replacements: { id: containerId } })).rejects.toThrow(/append-only/);
    await expect(db().query("DELETE FROM stock_ledger WHERE container_id = :id", { replacements: { id: containerId } })).rejects.toThrow(/append-only/);
  });
});

describe("safety data sheets", () => {
  it("stores a PDF in the database and refuses anything else", async () => {
    const { chemicalId } = await freshContainer("1", "g");
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
    const saved = await uploadSafetyDataSheet({ labId: LAB, actorUserId: KEEPER, chemicalId, filename: "sds.pdf", bytes: pdf });
    expect(saved.sizeBytes).toBe(pdf.length);
    const back = await getSafetyDataSheet({ labId: LAB, chemicalId });
    expect(Buffer.compare(back.data, Buffer.from(pdf))).toBe(0);
    await expect(uploadSafetyDataSheet({ labId: LAB, actorUserId: KEEPER, chemicalId, filename: "x.pdf", bytes: new TextEncoder().encode("<html>") })).rejects.toMatchObject({ code: "invalid_input", issues: [{ path: "file" }] });
    await expect(getSafetyDataSheet({ labId: HARROW, chemicalId })).rejects.toMatchObject({ code: "not_found" });
    await expect(uploadSafetyDataSheet({ labId: HARROW, actorUserId: SEED.users.harrowChemist.id, chemicalId, filename: "x.pdf", bytes: pdf })).rejects.toMatchObject({ code: "not_found" });
  });
});

describe("tenant isolation", () => {
  it("another lab's containers are invisible (not_found) and not listed", async () => {
    const { containerId, barcode } = await freshContainer("1", "g");
    await expect(getContainer({ labId: HARROW, containerId })).rejects.toMatchObject({ code: "not_found" });
    await expect(containerLedger({ labId: HARROW, containerId })).rejects.toMatchObject({ code: "not_found" });
    await expect(reserveStock({ labId: HARROW, actorUserId: SEED.users.harrowChemist.id, input: { planRef: "x", lines: [{ containerId, amount: "1", unit: "mg" }] } })).rejects.toMatchObject({ code: "not_found" });
    const harrow = await listContainers({ labId: HARROW, query: { q: barcode } });
    expect(harrow.total).toBe(0);
    const harrowAll = await listContainers({ labId: HARROW, query: { pageSize: 200 } });
    expect(harrowAll.rows.every((r) => r.barcode.startsWith("HF-"))).toBe(true);
    expect(harrowAll.total).toBe(3);
  });
});

describe("demo seed and availability", () => {
  it("finds seeded containers by barcode, CAS and location, with server-side paging", async () => {
    expect((await listContainers({ labId: LAB, query: { q: "KB-000901" } })).rows.map((r) => r.chemicalName)).toEqual(["n-Butyllithium, 2.5 M in hexanes"]);
    expect((await listContainers({ labId: LAB, query: { q: "109-99-9" } })).total).toBe(3);
    const page2 = await listContainers({ labId: LAB, query: { q: "KB-", sort: "barcode", pageSize: 10, page: 2 } });
    expect(page2.rows).toHaveLength(10);
    // seeded KB- barcodes in order: 101 102 103 201 202 203 301 302 303 401 | 402 … → page 2 starts at the 11th
    expect(page2.rows[0]?.barcode).toBe("KB-000402");
  });

  it("Study B is short of n-butyllithium; the old THF bottle needs a peroxide test", async () => {
    const [buli] = await db().query<{ id: string }>("SELECT id FROM chemicals WHERE lab_id = :lab AND cas = '109-72-8'", { replacements: { lab: LAB }, type: QueryTypes.SELECT });
    const [thf] = await db().query<{ id: string }>("SELECT id FROM chemicals WHERE lab_id = :lab AND cas = '109-99-9'", { replacements: { lab: LAB }, type: QueryTypes.SELECT });
    // Study B needs 24 mmol n-BuLi; the usable bottle holds 8 mL × 2.5 M = 20 mmol (the other is quarantined).
    const a = await checkAvailability({ labId: LAB, input: { requirements: [{ chemicalId: buli!.id, amount: "24", unit: "mmol" }, { chemicalId: thf!.id, amount: "200", unit: "mL" }] } });
    expect(a.lines[0]?.picks.map((p) => [p.barcode, p.amountBase])).toEqual([["KB-000901", "8000000"]]);
    expect(a.shortfalls).toEqual([{ chemicalId: buli!.id, name: "n-Butyllithium, 2.5 M in hexanes", amount: 4, unit: "mmol" }]);
    expect(a.warnings.some((w) => w.code === "peroxide_test_due" && w.message.includes("KB-001001"))).toBe(true);
    expect(a.warnings.some((w) => w.code === "low_stock" && w.chemicalId === buli!.id)).toBe(true);
    const alerts = await stockAlerts({ labId: LAB });
    expect(alerts.lowStock.map((l) => l.name)).toContain("n-Butyllithium, 2.5 M in hexanes");
    expect(alerts.peroxideDue.map((c) => c.barcode)).toContain("KB-001001");
    expect(alerts.nearExpiry.length).toBeGreaterThanOrEqual(3);
  });
});
