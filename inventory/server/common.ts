import "server-only";
import { QueryTypes, UniqueConstraintError, type Transaction } from "sequelize";
import { db } from "@/lib/server/db";
import { AppError } from "@/lib/errors/app-error";
import { Lab, StockLedgerEntry } from "@/lib/server/models";
import { labThresholdsSchema } from "@/lib/hazards/thresholds";
import type { LedgerKind } from "@/models/stock-ledger-entry";
import type { AmountView } from "@/inventory/schemas";
import type { PeroxideIntervals } from "../peroxide";
import { formatAmount, type Dimension } from "../units";

/** Today's date in UTC as YYYY-MM-DD. */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** An amount for the API: exact base units as a string, plus "12.5 mg" for display. */
export function amountView(base: bigint | string, dimension: Dimension, unit?: string): AmountView {
  const b = typeof base === "bigint" ? base : BigInt(base);
  return { base: b.toString(), dimension, display: formatAmount(b, dimension, unit) };
}

/** The amount held by open reservations of one container (read inside the caller's transaction). */
export async function heldBase(containerId: string, t?: Transaction): Promise<bigint> {
  const rows = await db().query<{ held: string }>(
    "SELECT COALESCE(SUM(amount_base), 0)::text AS held FROM reservations WHERE container_id = :id AND status = 'held'",
    { replacements: { id: containerId }, type: QueryTypes.SELECT, transaction: t },
  );
  return BigInt(rows[0]?.held ?? "0");
}

/** Held amounts of many containers at once, by container id. */
export async function heldByContainer(containerIds: string[], t?: Transaction): Promise<Map<string, bigint>> {
  const out = new Map<string, bigint>();
  if (containerIds.length === 0) return out;
  const rows = await db().query<{ id: string; held: string }>(
    "SELECT container_id AS id, SUM(amount_base)::text AS held FROM reservations WHERE container_id IN (:ids) AND status = 'held' GROUP BY container_id",
    { replacements: { ids: containerIds }, type: QueryTypes.SELECT, transaction: t },
  );
  for (const r of rows) out.set(r.id, BigInt(r.held));
  return out;
}

/** Appends one line to the stock ledger in the caller's transaction. */
export async function appendLedger(
  entry: { labId: string; containerId: string; reservationId?: string | null; kind: LedgerKind; deltaBase: bigint; heldDeltaBase?: bigint; balanceBase: bigint; reason: string; actorUserId: string | null },
  t: Transaction,
): Promise<void> {
  await StockLedgerEntry.create(
    {
      labId: entry.labId,
      containerId: entry.containerId,
      reservationId: entry.reservationId ?? null,
      kind: entry.kind,
      deltaBase: entry.deltaBase.toString(),
      heldDeltaBase: (entry.heldDeltaBase ?? 0n).toString(),
      balanceBase: entry.balanceBase.toString(),
      reason: entry.reason,
      actorUserId: entry.actorUserId,
    },
    { transaction: t },
  );
}

/** The lab's peroxide test intervals (its thresholds, or the defaults). */
export async function peroxideIntervalsFor(labId: string, t?: Transaction): Promise<PeroxideIntervals> {
  const lab = await Lab.findByPk(labId, { transaction: t });
  const settings = (lab?.settings ?? {}) as Record<string, unknown>;
  const parsed = labThresholdsSchema.safeParse(settings.thresholds ?? {});
  return (parsed.success ? parsed.data : labThresholdsSchema.parse({})).peroxideTestIntervalMonths;
}

/** Turns a unique-index violation into a conflict on `path`; rethrows anything else. */
export function uniqueToConflict(e: unknown, path: string, message: string): never {
  if (e instanceof UniqueConstraintError) throw new AppError("conflict", message, [{ path, message }]);
  throw e;
}

/**
 * Refuses an edit made from a stale copy: `sent` is the version the client read, `current`
 * the record's version now (read under its row lock). Conflict naming `version`.
 */
export function assertVersion(what: string, current: number, sent: number): void {
  if (current !== sent) {
    throw new AppError("conflict", `Someone changed this ${what} since you read it (it is at version ${current}, you sent ${sent}). Reload it and make your change again.`, [
      { path: "version", message: `stale: the ${what} is at version ${current}` },
    ]);
  }
}
