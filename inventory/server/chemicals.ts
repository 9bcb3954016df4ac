import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { impliedHazards } from "@/lib/hazards/hazard-flags";
import { chemicalInputSchema, chemicalUpdateSchema, type ChemicalRow, type ChemicalValues } from "@/inventory/schemas";
import { db, inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Chemical, SafetyDataSheet } from "@/lib/server/models";
import { fromBase, toBase } from "../units";
import { toDecimalString } from "../decimal";
import { amountView, assertVersion, uniqueToConflict } from "./common";

/**
 * The flags GHS statements imply (lib/hazards/hazard-flags.ts, the one mapping): H250
 * pyrophoric; H260/H261/EUH014 water-reactive. The peroxide class is stored as declared;
 * EUH019 without a class makes an unclassified former wherever the record is used.
 */
function impliedFlags(v: Pick<ChemicalValues, "ghsStatements" | "pyrophoric" | "waterReactive" | "peroxideClass">) {
  const h = impliedHazards({ ghs: v.ghsStatements, pyrophoric: v.pyrophoric, waterReactive: v.waterReactive, peroxideClass: v.peroxideClass });
  return { pyrophoric: h.pyrophoric, waterReactive: h.waterReactive, peroxideClass: v.peroxideClass };
}

function attributes(v: ChemicalValues) {
  const low = v.lowStock ? toBase(v.lowStock.amount, v.lowStock.unit) : null;
  return {
    name: v.name,
    synonyms: v.synonyms,
    cas: v.cas,
    formula: v.formula,
    molarMass: v.molarMass,
    density: v.density,
    physicalState: v.physicalState,
    ghsStatements: [...new Set(v.ghsStatements)],
    ...impliedFlags(v),
    storageNotes: v.storageNotes,
    lowStockBase: low ? low.base.toString() : null,
    lowStockDimension: low ? low.dimension : null,
  };
}

/**
 * Adds a chemical to the lab's catalogue (CAS number checked by its check digit; unique
 * per lab). GHS statements set the matching flags (H250 pyrophoric, H260/H261/EUH014
 * water-reactive; lib/hazards/hazard-flags.ts). Audited. Runs in the caller's transaction `t` when given.
 * @throws AppError invalid_input, conflict (CAS already in the catalogue).
 */
export async function createChemical(opts: { labId: string; actorUserId: string; input: unknown }, t?: Transaction): Promise<{ id: string; version: number }> {
  const v = parseOrThrow(chemicalInputSchema, opts.input);
  return inTransaction(t, async (t) => {
    const chem = await Chemical.create({ labId: opts.labId, ...attributes(v) }, { transaction: t }).catch((e: unknown) => uniqueToConflict(e, "cas", `CAS ${v.cas} is already in the catalogue.`));
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "chemical.created", entityType: "chemical", entityId: chem.id, after: attributes(v) }, t);
    return { id: chem.id, version: chem.version };
  });
}

/** A chemical's record as the create schema's input, for merging a partial change into it. */
function currentValues(chem: Chemical): Record<string, unknown> {
  const lowUnit = chem.lowStockDimension === "mass" ? "µg" : "µL";
  return {
    name: chem.name,
    synonyms: chem.synonyms,
    cas: chem.cas,
    formula: chem.formula,
    molarMass: chem.molarMass,
    density: chem.density,
    physicalState: chem.physicalState,
    ghsStatements: chem.ghsStatements,
    pyrophoric: chem.pyrophoric,
    waterReactive: chem.waterReactive,
    peroxideClass: chem.peroxideClass,
    storageNotes: chem.storageNotes,
    lowStock: chem.lowStockBase !== null ? { amount: toDecimalString(fromBase(BigInt(chem.lowStockBase), lowUnit), 3), unit: lowUnit } : null,
  };
}

/**
 * Changes a chemical's catalogue record: only the fields sent change (a PATCH of
 * `storageNotes` leaves GHS statements, flags, state and synonyms as they are). The input
 * carries the `version` the client read; the row is locked and a stale version is a
 * conflict naming `version`. The merged record is validated as a whole. Audited with
 * before and after. Returns the new version.
 * @throws AppError not_found (another lab's or none), invalid_input, conflict (stale version, CAS taken).
 */
export async function updateChemical(opts: { labId: string; actorUserId: string; chemicalId: string; input: unknown }, t?: Transaction): Promise<{ id: string; version: number }> {
  const { version, ...patch } = parseOrThrow(chemicalUpdateSchema, opts.input);
  return inTransaction(t, async (t) => {
    const chem = await Chemical.findOne({ where: { id: opts.chemicalId, labId: opts.labId }, lock: t.LOCK.UPDATE, transaction: t });
    if (!chem) throw new AppError("not_found", "No such chemical in this lab.");
    assertVersion("chemical", chem.version, version);
    const before = chem.toJSON();
    const merged = parseOrThrow(chemicalInputSchema, { ...currentValues(chem), ...patch });
    chem.set(attributes(merged));
    await chem.save({ transaction: t }).catch((e: unknown) => uniqueToConflict(e, "cas", `CAS ${merged.cas} is already in the catalogue.`));
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "chemical.updated", entityType: "chemical", entityId: chem.id, before, after: chem.toJSON() }, t);
    return { id: chem.id, version: chem.version };
  });
}

/** Every chemical of the lab with what is on hand (per dimension), its container count and its safety data sheet. */
export async function listChemicals(opts: { labId: string; q?: string }, t?: Transaction): Promise<ChemicalRow[]> {
  const chems = await Chemical.findAll({ where: { labId: opts.labId }, order: [["name", "ASC"]], transaction: t });
  const sums = await db().query<{ chemical_id: string; dimension: "mass" | "volume"; total: string; n: string }>(
    "SELECT chemical_id, dimension, SUM(amount_base)::text AS total, COUNT(*)::text AS n FROM containers WHERE lab_id = :lab AND status IN ('available','quarantined') GROUP BY chemical_id, dimension",
    { replacements: { lab: opts.labId }, type: QueryTypes.SELECT, transaction: t },
  );
  const counts = await db().query<{ chemical_id: string; n: string }>("SELECT chemical_id, COUNT(*)::text AS n FROM containers WHERE lab_id = :lab GROUP BY chemical_id", { replacements: { lab: opts.labId }, type: QueryTypes.SELECT, transaction: t });
  const sds = await SafetyDataSheet.findAll({ where: { labId: opts.labId }, attributes: ["chemicalId", "filename", "sizeBytes", "createdAt"], transaction: t });
  const sdsBy = new Map(sds.map((s) => [s.chemicalId, s]));
  const q = (opts.q ?? "").trim().toLowerCase();
  return [...chems]
    .sort((a, b) => a.name.localeCompare(b.name, "en", { sensitivity: "base" }))
    .filter((c) => !q || c.name.toLowerCase().includes(q) || (c.cas ?? "").includes(q) || c.synonyms.some((s) => s.toLowerCase().includes(q)) || (c.formula ?? "").toLowerCase().includes(q))
    .map((c) => {
      const s = sdsBy.get(c.id);
      return {
        id: c.id,
        version: c.version,
        name: c.name,
        synonyms: c.synonyms,
        cas: c.cas,
        formula: c.formula,
        molarMass: c.molarMass,
        density: c.density,
        physicalState: c.physicalState,
        ghsStatements: c.ghsStatements,
        pyrophoric: c.pyrophoric,
        waterReactive: c.waterReactive,
        peroxideClass: c.peroxideClass,
        storageNotes: c.storageNotes,
        lowStock: c.lowStockBase !== null && c.lowStockDimension ? amountView(c.lowStockBase, c.lowStockDimension) : null,
        onHand: sums.filter((x) => x.chemical_id === c.id).map((x) => amountView(x.total, x.dimension)),
        containerCount: Number(counts.find((x) => x.chemical_id === c.id)?.n ?? 0),
        sds: s ? { filename: s.filename, sizeBytes: s.sizeBytes, uploadedAt: s.createdAt.toISOString() } : null,
      };
    });
}
