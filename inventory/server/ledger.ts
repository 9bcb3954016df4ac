import "server-only";
import { AppError } from "@/lib/errors/app-error";
import type { LedgerRow, ReservationRow } from "@/inventory/schemas";
import { Chemical, Container, Reservation, StockLedgerEntry, User } from "@/lib/server/models";
import { Op, type Transaction } from "sequelize";
import { amountView } from "./common";

/** A container's ledger, oldest first, with who made each change. @throws AppError not_found. */
export async function containerLedger(opts: { labId: string; containerId: string }, t?: Transaction): Promise<LedgerRow[]> {
  const c = await Container.findOne({ where: { id: opts.containerId, labId: opts.labId }, attributes: ["id", "dimension", "displayUnit"], transaction: t });
  if (!c) throw new AppError("not_found", "No such container in this lab.");
  const lines = await StockLedgerEntry.findAll({ where: { containerId: c.id, labId: opts.labId }, order: [["id", "ASC"]], transaction: t });
  const users = await User.findAll({ where: { id: { [Op.in]: [...new Set(lines.map((l) => l.actorUserId).filter((x): x is string => !!x))] } }, attributes: ["id", "name"], transaction: t });
  const names = new Map(users.map((u) => [u.id, u.name]));
  return lines.map((l) => ({
    id: String(l.id),
    kind: l.kind,
    delta: amountView(l.deltaBase, c.dimension, c.displayUnit),
    heldDelta: amountView(l.heldDeltaBase, c.dimension, c.displayUnit),
    balance: amountView(l.balanceBase, c.dimension, c.displayUnit),
    reason: l.reason,
    reservationId: l.reservationId,
    actor: l.actorUserId ? (names.get(l.actorUserId) ?? null) : null,
    at: l.createdAt.toISOString(),
  }));
}

/** The lab's reservations (newest first), optionally by status, plan or container. */
export async function listReservations(opts: { labId: string; status?: "held" | "consumed" | "released" | "all"; planRef?: string; containerId?: string; limit?: number }, t?: Transaction): Promise<ReservationRow[]> {
  const where: Record<string, unknown> = { labId: opts.labId };
  if (opts.status && opts.status !== "all") where.status = opts.status;
  if (opts.planRef) where.planRef = opts.planRef;
  if (opts.containerId) where.containerId = opts.containerId;
  const rows = await Reservation.findAll({
    where,
    include: [{ model: Container, as: "container", required: true, where: { labId: opts.labId }, include: [{ model: Chemical, as: "chemical", required: true }] }],
    order: [["createdAt", "DESC"]],
    limit: Math.min(opts.limit ?? 500, 2000),
    transaction: t,
  });
  const users = await User.findAll({ where: { id: { [Op.in]: [...new Set(rows.map((r) => r.reservedBy))] } }, attributes: ["id", "name"], transaction: t });
  const names = new Map(users.map((u) => [u.id, u.name]));
  return rows.map((r) => {
    const c = r.container!;
    return {
      id: r.id,
      planRef: r.planRef,
      containerId: c.id,
      barcode: c.barcode,
      chemicalName: c.chemical?.name ?? "",
      amount: amountView(r.amountBase, c.dimension, c.displayUnit),
      consumed: r.consumedBase !== null ? amountView(r.consumedBase, c.dimension, c.displayUnit) : null,
      status: r.status,
      note: r.note,
      reservedBy: names.get(r.reservedBy) ?? r.reservedBy,
      reservedAt: r.createdAt.toISOString(),
      closedAt: r.closedAt ? r.closedAt.toISOString() : null,
    };
  });
}
