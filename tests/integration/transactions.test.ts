/**
 * Composable transactions: domain operations run in the caller's transaction, so a flow
 * commits or rolls back as one. The expected counts are computed in each test from the
 * rows it made (every reservation writes one reservation row, one "reserved" ledger line
 * and one audit entry: inventory/server/reserve-stock.ts).
 */
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { transaction } from "@/lib/server/db";
import { AppError } from "@/lib/errors/app-error";
import { createChemical } from "@/inventory/server/chemicals";
import { createContainer, getContainer } from "@/inventory/server/containers";
import { reserveStock } from "@/inventory/server/reserve-stock";
import { releaseReservationsForPlan } from "@/inventory/server/close-reservation";
import { listReservations } from "@/inventory/server/ledger";

const LAB = SEED.labs.kestrel.id;
const KEEPER = SEED.users.stockkeeper.id;

async function freshContainer(amount: string, unit: string) {
  const tag = randomUUID().slice(0, 8);
  const chem = await createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: `Tx reagent ${tag}` } });
  const box = await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: chem.id, barcode: `TX-${tag}`, amount, unit } });
  return box.id;
}

/** Rows that belong to one container: reservations, ledger lines and audit entries about its reservations. */
async function rowsFor(containerId: string) {
  const one = async (sql: string) => Number((await db().query<{ n: string }>(sql, { replacements: { id: containerId }, type: QueryTypes.SELECT }))[0]!.n);
  return {
    reservations: await one("SELECT COUNT(*)::text AS n FROM reservations WHERE container_id = :id"),
    held: await one("SELECT COUNT(*)::text AS n FROM reservations WHERE container_id = :id AND status = 'held'"),
    ledger: await one("SELECT COUNT(*)::text AS n FROM stock_ledger WHERE container_id = :id"),
    // reservation.created entries name their container; release/consume entries name the reservation.
    audit: await one("SELECT COUNT(*)::text AS n FROM audit_log WHERE (action = 'reservation.created' AND after->>'containerId' = :id) OR (entity_type = 'reservation' AND action <> 'reservation.created' AND entity_id IN (SELECT id::text FROM reservations WHERE container_id = :id))"),
  };
}

class LaterStepFailed extends Error {}

describe("operations in the caller's transaction", () => {
  it("a failure after reserving, in the same transaction, rolls back the reservation, its ledger line and its audit entry", async () => {
    const containerId = await freshContainer("10", "g");
    const before = await rowsFor(containerId);
    let reservedInside = 0;
    await expect(
      transaction(async (t) => {
        const rows = await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: `tx-${randomUUID()}`, lines: [{ containerId, amount: "4", unit: "g" }] } }, t);
        reservedInside = rows.length;
        // Inside the transaction the hold is visible: 10 g − 4 g = 6 g free (in µg).
        expect((await getContainer({ labId: LAB, containerId }, t)).available.base).toBe("6000000");
        throw new LaterStepFailed("the next step of the flow failed");
      }),
    ).rejects.toBeInstanceOf(LaterStepFailed);
    expect(reservedInside).toBe(1);
    expect(await rowsFor(containerId)).toEqual(before);
    expect((await getContainer({ labId: LAB, containerId })).available.base).toBe("10000000");
  });

  it("the same calls without a transaction commit on their own (the counts move by one each)", async () => {
    const containerId = await freshContainer("10", "g");
    const before = await rowsFor(containerId);
    await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef: `tx-${randomUUID()}`, lines: [{ containerId, amount: "4", unit: "g" }] } });
    const after = await rowsFor(containerId);
    expect(after.reservations - before.reservations).toBe(1);
    expect(after.ledger - before.ledger).toBe(1);
    expect(after.audit - before.audit).toBe(1);
  });

  it("release a plan's holds and reserve anew, as one: when the new reservation is refused, the old holds stay", async () => {
    const containerId = await freshContainer("10", "g");
    const planRef = `tx-plan-${randomUUID()}`;
    await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef, lines: [{ containerId, amount: "3", unit: "g" }] } });
    const before = await rowsFor(containerId);
    // Releasing 3 g frees the whole 10 g; asking 11 g is then still more than the container has.
    const err = await transaction(async (t) => {
      const { released } = await releaseReservationsForPlan({ labId: LAB, actorUserId: KEEPER, planRef, reason: "plan edited, stock reserved again" }, t);
      expect(released).toBe(1);
      await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef, lines: [{ containerId, amount: "11", unit: "g" }] } }, t);
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).code).toBe("conflict");
    expect((err as AppError).issues[0]?.path).toBe("lines.0.amount");
    expect(await rowsFor(containerId)).toEqual(before);
    expect((await listReservations({ labId: LAB, planRef, status: "held" })).map((r) => r.amount.base)).toEqual(["3000000"]);
  });

  it("release a plan's holds and reserve anew, as one: when both succeed, the plan holds only the new amount", async () => {
    const containerId = await freshContainer("10", "g");
    const planRef = `tx-plan-${randomUUID()}`;
    await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef, lines: [{ containerId, amount: "3", unit: "g" }] } });
    await transaction(async (t) => {
      await releaseReservationsForPlan({ labId: LAB, actorUserId: KEEPER, planRef }, t);
      await reserveStock({ labId: LAB, actorUserId: KEEPER, input: { planRef, lines: [{ containerId, amount: "8", unit: "g" }] } }, t);
    });
    expect((await listReservations({ labId: LAB, planRef, status: "held" })).map((r) => r.amount.base)).toEqual(["8000000"]);
    expect((await listReservations({ labId: LAB, planRef, status: "released" })).map((r) => r.amount.base)).toEqual(["3000000"]);
    expect((await getContainer({ labId: LAB, containerId })).available.base).toBe("2000000");
  });
});
