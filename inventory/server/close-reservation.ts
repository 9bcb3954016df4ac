import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { consumeInputSchema, releaseInputSchema, planRefSchema } from "@/inventory/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Container, Reservation } from "@/lib/server/models";
import { formatAmount, toBase, unitInfo } from "../units";
import { appendLedger, heldBase } from "./common";

/** Locks a reservation's container and then the reservation itself (the same order reserveStock uses). */
async function lockReservation(labId: string, reservationId: string, t: Transaction): Promise<{ r: Reservation; c: Container }> {
  const peek = await Reservation.findOne({ where: { id: reservationId, labId }, transaction: t });
  if (!peek) throw new AppError("not_found", "No such reservation in this lab.");
  const c = await Container.findOne({ where: { id: peek.containerId, labId }, lock: t.LOCK.UPDATE, transaction: t });
  const r = await Reservation.findOne({ where: { id: reservationId, labId }, lock: t.LOCK.UPDATE, transaction: t });
  if (!c || !r) throw new AppError("not_found", "No such reservation in this lab.");
  if (r.status !== "held") throw new AppError("conflict", `This reservation is already ${r.status}.`);
  return { r, c };
}

/**
 * Consumes a held reservation with the amount actually used: the container's amount goes
 * down by that amount, the whole reservation stops holding stock (so what was reserved
 * but not used is free again), and the ledger records both. A container that reaches
 * zero becomes "empty".
 * @throws AppError not_found, conflict (not held, or more used than the container has
 *   free for this reservation), invalid_input (unit of the wrong dimension).
 */
export async function consumeReservation(opts: { labId: string; actorUserId: string; reservationId: string; input: unknown }, t?: Transaction) {
  const input = parseOrThrow(consumeInputSchema, opts.input);
  return inTransaction(t, async (t) => {
    const { r, c } = await lockReservation(opts.labId, opts.reservationId, t);
    if (unitInfo(input.unit)?.dimension !== c.dimension) throw AppError.field("unit", `${c.barcode} is measured by ${c.dimension}`);
    const used = toBase(input.amount, input.unit).base;
    const amount = BigInt(c.amountBase);
    const reserved = BigInt(r.amountBase);
    const heldByOthers = (await heldBase(c.id, t)) - reserved;
    if (used > amount - heldByOthers) {
      throw new AppError("conflict", `${c.barcode} has only ${formatAmount(amount - heldByOthers, c.dimension, c.displayUnit)} for this reservation.`, [{ path: "amount", message: "more than the container has for it" }]);
    }
    const after = amount - used;
    c.amountBase = after.toString();
    if (after === 0n) c.status = "empty";
    await c.save({ transaction: t });
    r.status = "consumed";
    r.consumedBase = used.toString();
    r.closedBy = opts.actorUserId;
    r.closedAt = new Date();
    if (input.note) r.note = input.note;
    await r.save({ transaction: t });
    const back = reserved > used ? `; ${formatAmount(reserved - used, c.dimension, c.displayUnit)} not used returns to stock` : "";
    await appendLedger({ labId: opts.labId, containerId: c.id, reservationId: r.id, kind: "consumed", deltaBase: -used, heldDeltaBase: -reserved, balanceBase: after, reason: `Used ${formatAmount(used, c.dimension, c.displayUnit)} for plan ${r.planRef}${back}`, actorUserId: opts.actorUserId }, t);
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "reservation.consumed", entityType: "reservation", entityId: r.id, before: { status: "held", amountBase: r.amountBase }, after: { status: "consumed", consumedBase: used.toString(), containerAmountBase: after.toString() } }, t);
    return { id: r.id, status: r.status, consumedBase: used.toString(), containerAmountBase: after.toString() };
  });
}

async function releaseLocked(opts: { labId: string; actorUserId: string; reason: string }, r: Reservation, c: Container, t: Transaction): Promise<void> {
  r.status = "released";
  r.closedBy = opts.actorUserId;
  r.closedAt = new Date();
  await r.save({ transaction: t });
  const reserved = BigInt(r.amountBase);
  await appendLedger({ labId: opts.labId, containerId: c.id, reservationId: r.id, kind: "released", deltaBase: 0n, heldDeltaBase: -reserved, balanceBase: BigInt(c.amountBase), reason: opts.reason, actorUserId: opts.actorUserId }, t);
  await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "reservation.released", entityType: "reservation", entityId: r.id, before: { status: "held" }, after: { status: "released", reason: opts.reason } }, t);
}

/**
 * Releases one held reservation (nothing is taken from the container; the amount is free
 * again), with the reason in the ledger and the audit log.
 * @throws AppError not_found, conflict (not held), invalid_input (no reason).
 */
export async function releaseReservation(opts: { labId: string; actorUserId: string; reservationId: string; input: unknown }, t?: Transaction) {
  const { reason } = parseOrThrow(releaseInputSchema, opts.input);
  return inTransaction(t, async (t) => {
    const { r, c } = await lockReservation(opts.labId, opts.reservationId, t);
    await releaseLocked({ labId: opts.labId, actorUserId: opts.actorUserId, reason }, r, c, t);
    return { id: r.id, status: r.status };
  });
}

/**
 * Releases every held reservation of a plan reference — what the plans feature calls in
 * its own transaction `t` when a plan is cancelled or released again, so "cancel and
 * release" (or "release the old holds and reserve anew") commits or rolls back as one and
 * a reservation never outlives its plan. Locks the containers in id order, then the
 * reservations (the order reserveStock uses). With `planId`, the reservations tied to that
 * plan row are released (whatever their text reference). Returns how many were released
 * (0 when none were held).
 * @throws AppError invalid_input for an empty plan reference or reason.
 */
export async function releaseReservationsForPlan(opts: { labId: string; actorUserId: string; planRef: string; planId?: string; reason?: string }, t?: Transaction): Promise<{ released: number }> {
  const planRef = parseOrThrow(planRefSchema, opts.planRef, "The plan reference is not valid.");
  const reason = parseOrThrow(releaseInputSchema, { reason: opts.reason ?? `Plan ${planRef} cancelled` }).reason;
  const ofPlan = opts.planId ? { planId: opts.planId } : { planRef };
  return inTransaction(t, async (t) => {
    const open = await Reservation.findAll({ where: { labId: opts.labId, ...ofPlan, status: "held" }, transaction: t });
    if (open.length === 0) return { released: 0 };
    const containerIds = [...new Set(open.map((r) => r.containerId))].sort();
    const containers = await Container.findAll({ where: { id: { [Op.in]: containerIds }, labId: opts.labId }, order: [["id", "ASC"]], lock: t.LOCK.UPDATE, transaction: t });
    const byId = new Map(containers.map((c) => [c.id, c]));
    const locked = await Reservation.findAll({ where: { labId: opts.labId, ...ofPlan, status: "held", containerId: { [Op.in]: containerIds } }, order: [["id", "ASC"]], lock: t.LOCK.UPDATE, transaction: t });
    let released = 0;
    for (const r of locked) {
      if (r.status !== "held") continue;
      const c = byId.get(r.containerId);
      if (!c) continue;
      await releaseLocked({ labId: opts.labId, actorUserId: opts.actorUserId, reason }, r, c, t);
      released++;
    }
    return { released };
  });
}
