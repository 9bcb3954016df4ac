import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, type FieldIssue } from "@/lib/errors/app-error";
import { consumeReservation, releaseReservation } from "@/inventory/server/close-reservation";
import { Container, Reservation, type Plan } from "@/lib/server/models";
import type { z } from "zod";
import type { consumptionLineSchema } from "../schemas";

type ConsumptionLine = z.output<typeof consumptionLineSchema>;

/** A base amount as the consume operation takes it: µg exactly, or nL as µL with three decimals. */
function plannedAmount(base: string, dimension: "mass" | "volume"): { amount: string; unit: "µg" | "µL" } {
  if (dimension === "mass") return { amount: base, unit: "µg" };
  const b = BigInt(base);
  return { amount: `${b / 1000n}.${(b % 1000n).toString().padStart(3, "0")}`, unit: "µL" };
}

/**
 * Consumes the plan's held reservations once its results are complete (issue 12 "Stock
 * follows results"): the held reservations tied to the plan by `reservations.plan_id` (what
 * release reserved), each with the amount actually used — the line of `lines` naming it,
 * else the planned (reserved) amount — through the inventory's own consume operation in
 * the caller's transaction (the container goes down by that amount, what was reserved but
 * not used is free again, the ledger and the audit log record both); a reservation whose
 * used amount is zero is released instead. Containers are taken in id order.
 * @throws AppError invalid_input naming `consumption.<i>.reservationId` for a line that is not
 *   a held reservation of the plan; conflict (from the inventory) when more is used than a
 *   container has.
 */
export async function consumePlanStock(
  opts: { labId: string; actorUserId: string; plan: Plan; lines: readonly ConsumptionLine[] },
  t: Transaction,
): Promise<{ consumed: number; released: number }> {
  const held = await Reservation.findAll({
    where: { labId: opts.labId, planId: opts.plan.id, status: "held" },
    include: [{ model: Container, as: "container", attributes: ["id", "dimension"], required: true, where: { labId: opts.labId } }],
    order: [["containerId", "ASC"], ["id", "ASC"]],
    transaction: t,
  });
  const byId = new Map(held.map((r) => [r.id, r]));
  const issues: FieldIssue[] = [];
  const chosen = new Map<string, ConsumptionLine>();
  opts.lines.forEach((l, i) => {
    if (!byId.has(l.reservationId)) issues.push({ path: `consumption.${i}.reservationId`, message: "is not a held reservation of this plan" });
    else if (chosen.has(l.reservationId)) issues.push({ path: `consumption.${i}.reservationId`, message: "is given twice" });
    else chosen.set(l.reservationId, l);
  });
  if (issues.length) throw new AppError("invalid_input", "The amounts used are not valid; nothing was stored.", issues);
  let consumed = 0;
  let released = 0;
  const ids = held.map((r) => r.id);
  if (ids.length === 0) return { consumed, released };
  for (const r of await Reservation.findAll({ where: { id: { [Op.in]: ids }, labId: opts.labId }, order: [["containerId", "ASC"], ["id", "ASC"]], transaction: t })) {
    const line = chosen.get(r.id);
    const use = line ? { amount: line.amount, unit: line.unit } : plannedAmount(r.amountBase, byId.get(r.id)!.container!.dimension);
    if (/^0*(\.0*)?$/.test(use.amount)) {
      await releaseReservation({ labId: opts.labId, actorUserId: opts.actorUserId, reservationId: r.id, input: { reason: `Not used by plan ${opts.plan.name}` } }, t);
      released++;
    } else {
      await consumeReservation({ labId: opts.labId, actorUserId: opts.actorUserId, reservationId: r.id, input: { ...use, note: line?.note ?? `Results of plan ${opts.plan.name}` } }, t);
      consumed++;
    }
  }
  return { consumed, released };
}
