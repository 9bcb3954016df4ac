import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import { db } from "@/lib/server/db";
import { Chemical, Container, Location } from "@/lib/server/models";
import { Op } from "sequelize";
import { containerRow } from "./containers";
import { amountView, heldByContainer, peroxideIntervalsFor, todayIso } from "./common";

/** Containers expiring within this many days count as near expiry. */
export const NEAR_EXPIRY_DAYS = 30;

/**
 * The stockkeeper's list of things to act on in one lab: chemicals whose free stock is
 * below their low-stock mark, containers expired or expiring within 30 days, and
 * peroxide formers whose test is due.
 */
export async function stockAlerts(opts: { labId: string; today?: string }, t?: Transaction) {
  const today = opts.today ?? todayIso();
  const horizon = new Date(`${today}T00:00:00Z`);
  horizon.setUTCDate(horizon.getUTCDate() + NEAR_EXPIRY_DAYS);
  const soon = horizon.toISOString().slice(0, 10);
  const intervals = await peroxideIntervalsFor(opts.labId, t);

  const lowRows = await db().query<{ id: string; name: string; dim: "mass" | "volume"; mark: string; free: string }>(
    `SELECT ch.id, ch.name, ch.low_stock_dimension AS dim, ch.low_stock_base::text AS mark,
            (COALESCE(SUM(c.amount_base), 0) - COALESCE(SUM(h.held), 0))::text AS free
       FROM chemicals ch
       LEFT JOIN containers c ON c.chemical_id = ch.id AND c.lab_id = ch.lab_id AND c.status = 'available'
            AND c.dimension = ch.low_stock_dimension AND (c.expires_on IS NULL OR c.expires_on >= :today)
       LEFT JOIN (SELECT container_id, SUM(amount_base) AS held FROM reservations WHERE lab_id = :lab AND status = 'held' GROUP BY container_id) h ON h.container_id = c.id
      WHERE ch.lab_id = :lab AND ch.low_stock_base IS NOT NULL
      GROUP BY ch.id
     HAVING COALESCE(SUM(c.amount_base), 0) - COALESCE(SUM(h.held), 0) < ch.low_stock_base
      ORDER BY ch.name`,
    { replacements: { lab: opts.labId, today }, type: QueryTypes.SELECT, transaction: t },
  );
  const lowStock = lowRows.map((r) => ({ chemicalId: r.id, name: r.name, free: amountView(r.free, r.dim), mark: amountView(r.mark, r.dim) }));

  const include = [
    { model: Chemical, as: "chemical", required: true },
    { model: Location, as: "location", required: false },
  ];
  const expiring = await Container.findAll({ where: { labId: opts.labId, status: { [Op.in]: ["available", "quarantined"] }, expiresOn: { [Op.lte]: soon } }, include, order: [["expiresOn", "ASC"]], transaction: t });
  const peroxide = await Container.findAll({ where: { labId: opts.labId, status: { [Op.in]: ["available", "quarantined"] } }, include: [{ model: Chemical, as: "chemical", required: true, where: { [Op.or]: [{ peroxideClass: { [Op.ne]: null } }, { ghsStatements: { [Op.contains]: ["EUH019"] } }] } }, include[1]!], order: [["openedOn", "ASC"]], transaction: t });
  const held = await heldByContainer([...expiring, ...peroxide].map((c) => c.id), t);
  const peroxideDue = peroxide
    .map((c) => containerRow(c, held.get(c.id) ?? 0n, intervals))
    .filter((r) => r.flags.peroxideTestDue !== null && r.flags.peroxideTestDue <= soon);
  return {
    today,
    lowStock,
    expired: expiring.filter((c) => (c.expiresOn ?? "") < today).map((c) => containerRow(c, held.get(c.id) ?? 0n, intervals)),
    nearExpiry: expiring.filter((c) => (c.expiresOn ?? "") >= today).map((c) => containerRow(c, held.get(c.id) ?? 0n, intervals)),
    peroxideDue,
  };
}
