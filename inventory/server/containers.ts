import "server-only";
import { Op, col, fn, type Order, type Transaction, type WhereOptions } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { adjustAmountSchema, containerInputSchema, containerQuerySchema, containerUpdateSchema, type ContainerQuery, type ContainerRow } from "@/inventory/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Chemical, Container, Location } from "@/lib/server/models";
import { impliedHazards } from "@/lib/hazards/hazard-flags";
import { peroxideTestDue, type PeroxideIntervals } from "../peroxide";
import { formatAmount, toBase, unitInfo } from "../units";
import { amountView, appendLedger, assertVersion, heldBase, heldByContainer, peroxideIntervalsFor, uniqueToConflict } from "./common";

/** One container as the API shows it (amount, held and free with units; hazard flags). */
export function containerRow(c: Container, held: bigint, intervals: PeroxideIntervals): ContainerRow {
  const amount = BigInt(c.amountBase);
  const chem = c.chemical;
  return {
    id: c.id,
    version: c.version,
    barcode: c.barcode,
    chemicalId: c.chemicalId,
    chemicalName: chem?.name ?? "",
    cas: chem?.cas ?? null,
    lot: c.lot,
    locationId: c.locationId,
    location: c.location?.name ?? null,
    amount: amountView(amount, c.dimension, c.displayUnit),
    held: amountView(held, c.dimension, c.displayUnit),
    available: amountView(amount - held, c.dimension, c.displayUnit),
    displayUnit: c.displayUnit,
    concentration: c.concentration,
    concentrationUnit: c.concentrationUnit,
    solvent: c.solvent,
    purityPercent: c.purityPercent,
    receivedOn: c.receivedOn,
    openedOn: c.openedOn,
    expiresOn: c.expiresOn,
    peroxideTestedOn: c.peroxideTestedOn,
    status: c.status,
    flags: {
      pyrophoric: chem?.pyrophoric ?? false,
      waterReactive: chem?.waterReactive ?? false,
      peroxideClass: impliedHazards({ ghs: chem?.ghsStatements ?? [], peroxideClass: chem?.peroxideClass ?? null }).peroxideClass,
      peroxideTestDue: peroxideTestDue({ peroxideClass: chem?.peroxideClass ?? null, ghs: chem?.ghsStatements ?? [], openedOn: c.openedOn, receivedOn: c.receivedOn, testedOn: c.peroxideTestedOn, expiresOn: c.expiresOn, intervals }),
    },
  };
}

const include = [
  { model: Chemical, as: "chemical", required: true },
  { model: Location, as: "location", required: false },
];

/**
 * One page of the lab's containers, filtered (search over chemical name, synonyms, CAS,
 * barcode, lot and location; chemical, location, status) and sorted in the database.
 * @throws AppError invalid_input for a bad query.
 */
export async function listContainers(opts: { labId: string; query: unknown }, t?: Transaction): Promise<{ rows: ContainerRow[]; total: number; page: number; pageSize: number; query: ContainerQuery }> {
  const query = parseOrThrow(containerQuerySchema, opts.query);
  const where: WhereOptions = { labId: opts.labId };
  const and: WhereOptions[] = [];
  if (query.chemicalId) and.push({ chemicalId: query.chemicalId });
  if (query.locationId) and.push({ locationId: query.locationId });
  if (query.status !== "all") and.push({ status: query.status });
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
    and.push({
      [Op.or]: [
        { barcode: { [Op.iLike]: like } },
        { lot: { [Op.iLike]: like } },
        { "$chemical.name$": { [Op.iLike]: like } },
        { "$chemical.cas$": { [Op.iLike]: like } },
        { "$location.name$": { [Op.iLike]: like } },
      ],
    });
  }
  const dir = query.dir === "desc" ? "DESC" : "ASC";
  const orders: Record<ContainerQuery["sort"], Order> = {
    name: [[fn("lower", col("chemical.name")), dir], ["barcode", "ASC"]],
    barcode: [["barcode", dir]],
    amount: [["dimension", "ASC"], ["amountBase", dir], ["barcode", "ASC"]],
    expiresOn: [["expiresOn", `${dir} NULLS LAST`], ["barcode", "ASC"]],
    receivedOn: [["receivedOn", `${dir} NULLS LAST`], ["barcode", "ASC"]],
    location: [[fn("lower", col("location.name")), `${dir} NULLS LAST`], ["barcode", "ASC"]],
  };
  const { rows, count } = await Container.findAndCountAll({
    where: { ...where, ...(and.length ? { [Op.and]: and } : {}) },
    include,
    order: orders[query.sort],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
    subQuery: false,
    transaction: t,
  });
  const held = await heldByContainer(rows.map((r) => r.id), t);
  const intervals = await peroxideIntervalsFor(opts.labId, t);
  return { rows: rows.map((c) => containerRow(c, held.get(c.id) ?? 0n, intervals)), total: count, page: query.page, pageSize: query.pageSize, query };
}

/** One container of the lab. @throws AppError not_found (another lab's or none). */
export async function getContainer(opts: { labId: string; containerId: string }, t?: Transaction): Promise<ContainerRow> {
  const c = await Container.findOne({ where: { id: opts.containerId, labId: opts.labId }, include, transaction: t });
  if (!c) throw new AppError("not_found", "No such container in this lab.");
  return containerRow(c, await heldBase(c.id, t), await peroxideIntervalsFor(opts.labId, t));
}

/**
 * Receives a new container into stock: checks chemical and location belong to the lab
 * and the barcode is new, writes the container, a "received" ledger line and an audit
 * entry in one transaction (the caller's `t` when given).
 * @throws AppError invalid_input, not_found (chemical or location of another lab), conflict (barcode taken).
 */
export async function createContainer(opts: { labId: string; actorUserId: string; input: unknown }, t?: Transaction): Promise<{ id: string; version: number }> {
  const v = parseOrThrow(containerInputSchema, opts.input);
  const { base, dimension } = toBase(v.amount, v.unit);
  return inTransaction(t, async (t) => {
    const chem = await Chemical.findOne({ where: { id: v.chemicalId, labId: opts.labId }, transaction: t });
    if (!chem) throw new AppError("not_found", "No such chemical in this lab.", [{ path: "chemicalId", message: "no such chemical" }]);
    if (v.locationId && !(await Location.findOne({ where: { id: v.locationId, labId: opts.labId }, transaction: t }))) {
      throw new AppError("not_found", "No such location in this lab.", [{ path: "locationId", message: "no such location" }]);
    }
    const c = await Container.create(
      {
        labId: opts.labId,
        chemicalId: chem.id,
        locationId: v.locationId,
        barcode: v.barcode,
        lot: v.lot,
        dimension,
        amountBase: base.toString(),
        initialBase: base.toString(),
        displayUnit: unitInfo(v.unit)!.label,
        concentration: v.concentration,
        concentrationUnit: v.concentration ? v.concentrationUnit : null,
        solvent: v.solvent,
        purityPercent: v.purityPercent,
        receivedOn: v.receivedOn,
        openedOn: v.openedOn,
        expiresOn: v.expiresOn,
        peroxideTestedOn: null,
        status: base === 0n ? "empty" : "available",
      },
      { transaction: t },
    ).catch((e: unknown) => uniqueToConflict(e, "barcode", `Barcode ${v.barcode} is already used in this lab.`));
    await appendLedger({ labId: opts.labId, containerId: c.id, kind: "received", deltaBase: base, balanceBase: base, reason: `Received ${formatAmount(base, dimension, v.unit)}`, actorUserId: opts.actorUserId }, t);
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "container.created", entityType: "container", entityId: c.id, after: { ...v, amountBase: base.toString() } }, t);
    return { id: c.id, version: c.version };
  });
}

/**
 * Corrects the amount in a container after counting or weighing it (a stock-take), with
 * the reason in the ledger. The new amount may not fall below what reservations hold.
 * When the input carries the `version` the count was made against, a stale one is a
 * conflict (the amount changed meanwhile).
 * @throws AppError not_found, invalid_input (unit of the wrong dimension), conflict (below held, stale version).
 */
export async function adjustContainerAmount(opts: { labId: string; actorUserId: string; containerId: string; input: unknown }, t?: Transaction) {
  const v = parseOrThrow(adjustAmountSchema, opts.input);
  return inTransaction(t, async (t) => {
    const c = await Container.findOne({ where: { id: opts.containerId, labId: opts.labId }, lock: t.LOCK.UPDATE, transaction: t });
    if (!c) throw new AppError("not_found", "No such container in this lab.");
    if (v.version !== undefined) assertVersion("container", c.version, v.version);
    if (unitInfo(v.unit)?.dimension !== c.dimension) throw AppError.field("unit", `${c.barcode} is measured by ${c.dimension}`);
    const next = toBase(v.amount, v.unit).base;
    const held = await heldBase(c.id, t);
    if (next < held) throw new AppError("conflict", `Reservations hold ${formatAmount(held, c.dimension, c.displayUnit)} of ${c.barcode}; release them first.`, [{ path: "amount", message: "below what reservations hold" }]);
    const before = BigInt(c.amountBase);
    c.amountBase = next.toString();
    if (next === 0n && c.status === "available") c.status = "empty";
    if (next > 0n && c.status === "empty") c.status = "available";
    await c.save({ transaction: t });
    await appendLedger({ labId: opts.labId, containerId: c.id, kind: "adjusted", deltaBase: next - before, balanceBase: next, reason: v.reason, actorUserId: opts.actorUserId }, t);
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "container.adjusted", entityType: "container", entityId: c.id, before: { amountBase: before.toString() }, after: { amountBase: next.toString(), reason: v.reason } }, t);
    return { id: c.id, version: c.version, amountBase: next.toString() };
  });
}

/**
 * Changes a container's location, lot, dates or status (not its amount). A container
 * whose amount is held by reservations cannot be quarantined, emptied or disposed of.
 * Status changes are also written to the ledger. Only the fields sent change; the input
 * carries the `version` the client read, and a stale one is a conflict naming `version`.
 * Audited. Returns the new version.
 * @throws AppError not_found, invalid_input, conflict.
 */
export async function updateContainer(opts: { labId: string; actorUserId: string; containerId: string; input: unknown }, t?: Transaction) {
  const v = parseOrThrow(containerUpdateSchema, opts.input);
  const given = new Set(Object.keys(v));
  return inTransaction(t, async (t) => {
    const c = await Container.findOne({ where: { id: opts.containerId, labId: opts.labId }, lock: t.LOCK.UPDATE, transaction: t });
    if (!c) throw new AppError("not_found", "No such container in this lab.");
    assertVersion("container", c.version, v.version);
    const before = c.toJSON();
    if (given.has("locationId")) {
      if (v.locationId && !(await Location.findOne({ where: { id: v.locationId, labId: opts.labId }, transaction: t }))) throw new AppError("not_found", "No such location in this lab.", [{ path: "locationId", message: "no such location" }]);
      c.locationId = v.locationId ?? null;
    }
    if (given.has("lot")) c.lot = v.lot ?? null;
    if (given.has("openedOn")) c.openedOn = v.openedOn ?? null;
    if (given.has("expiresOn")) c.expiresOn = v.expiresOn ?? null;
    if (given.has("peroxideTestedOn")) c.peroxideTestedOn = v.peroxideTestedOn ?? null;
    if (v.status && v.status !== c.status) {
      const held = await heldBase(c.id, t);
      if (v.status !== "available" && held > 0n) throw new AppError("conflict", `Reservations hold ${formatAmount(held, c.dimension, c.displayUnit)} of ${c.barcode}; release them first.`, [{ path: "status", message: "reservations hold stock" }]);
      await appendLedger({ labId: opts.labId, containerId: c.id, kind: "status", deltaBase: 0n, balanceBase: BigInt(c.amountBase), reason: `Status ${c.status} → ${v.status}`, actorUserId: opts.actorUserId }, t);
      c.status = v.status;
    }
    await c.save({ transaction: t });
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "container.updated", entityType: "container", entityId: c.id, before, after: c.toJSON() }, t);
    return { id: c.id, version: c.version };
  });
}
