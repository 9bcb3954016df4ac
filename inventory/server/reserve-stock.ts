import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, parseOrThrow, type FieldIssue } from "@/lib/errors/app-error";
import { reserveInputSchema, type ReservationRow } from "@/inventory/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Container, Reservation } from "@/lib/server/models";
import { toBase, formatAmount, unitInfo } from "../units";
import { amountView, appendLedger, heldBase } from "./common";

/**
 * Reserves amounts of containers for a plan, all or nothing. In one transaction it locks
 * every container row involved (`SELECT … FOR UPDATE`, in id order so two requests can
 * never deadlock), reads what open reservations already hold, and refuses (conflict,
 * naming the line) any amount above what is free. So concurrent requests never hold more
 * than a container has. Each reservation gets a ledger line (held +amount) and an audit
 * entry. Runs in the caller's transaction `t` when given, so a flow such as "release a
 * plan and reserve its stock" commits or rolls back as one.
 * @throws AppError invalid_input (bad lines or units), not_found (a container of another
 *   lab or none), conflict (not available, or not enough free).
 */
export async function reserveStock(opts: { labId: string; actorUserId: string; input: unknown; planId?: string }, t?: Transaction): Promise<ReservationRow[]> {
  const input = parseOrThrow(reserveInputSchema, opts.input);
  const ids = [...new Set(input.lines.map((l) => l.containerId))].sort();
  return inTransaction(t, async (t) => {
    const containers = await Container.findAll({ where: { id: { [Op.in]: ids }, labId: opts.labId }, order: [["id", "ASC"]], lock: t.LOCK.UPDATE, transaction: t });
    const byId = new Map(containers.map((c) => [c.id, c]));
    const free = new Map<string, bigint>();
    for (const c of containers) free.set(c.id, BigInt(c.amountBase) - (await heldBase(c.id, t)));
    const issues: FieldIssue[] = [];
    const planned: Array<{ c: Container; base: bigint }> = [];
    input.lines.forEach((line, i) => {
      const c = byId.get(line.containerId);
      if (!c) throw new AppError("not_found", `No container ${line.containerId} in this lab.`, [{ path: `lines.${i}.containerId`, message: "no such container" }]);
      if (unitInfo(line.unit)?.dimension !== c.dimension) {
        issues.push({ path: `lines.${i}.unit`, message: `${c.barcode} is measured by ${c.dimension}; give a ${c.dimension} unit` });
        return;
      }
      if (c.status !== "available") throw new AppError("conflict", `${c.barcode} is ${c.status}; it cannot be reserved.`, [{ path: `lines.${i}.containerId`, message: `container is ${c.status}` }]);
      const base = toBase(line.amount, line.unit).base;
      const f = free.get(c.id) ?? 0n;
      if (base > f) {
        throw new AppError("conflict", `${c.barcode}: only ${formatAmount(f > 0n ? f : 0n, c.dimension, c.displayUnit)} free, ${formatAmount(base, c.dimension, c.displayUnit)} asked.`, [
          { path: `lines.${i}.amount`, message: `only ${formatAmount(f > 0n ? f : 0n, c.dimension, c.displayUnit)} free` },
        ]);
      }
      free.set(c.id, f - base);
      planned.push({ c, base });
    });
    if (issues.length) throw new AppError("invalid_input", "Some lines are not valid.", issues);
    const rows: ReservationRow[] = [];
    for (const { c, base } of planned) {
      const r = await Reservation.create(
        { labId: opts.labId, containerId: c.id, planRef: input.planRef, planId: opts.planId ?? null, amountBase: base.toString(), consumedBase: null, status: "held", note: input.note, reservedBy: opts.actorUserId, closedBy: null, closedAt: null },
        { transaction: t },
      );
      await appendLedger({ labId: opts.labId, containerId: c.id, reservationId: r.id, kind: "reserved", deltaBase: 0n, heldDeltaBase: base, balanceBase: BigInt(c.amountBase), reason: `Reserved for plan ${input.planRef}`, actorUserId: opts.actorUserId }, t);
      await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "reservation.created", entityType: "reservation", entityId: r.id, after: { containerId: c.id, barcode: c.barcode, planRef: input.planRef, amountBase: base.toString(), dimension: c.dimension } }, t);
      rows.push({
        id: r.id,
        planRef: r.planRef,
        containerId: c.id,
        barcode: c.barcode,
        chemicalName: "",
        amount: amountView(base, c.dimension, c.displayUnit),
        consumed: null,
        status: "held",
        note: r.note,
        reservedBy: opts.actorUserId,
        reservedAt: r.createdAt.toISOString(),
        closedAt: null,
      });
    }
    return rows;
  });
}
