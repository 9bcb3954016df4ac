import "server-only";
import { Op, col as column, fn, where, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { importRequestSchema } from "@/inventory/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Chemical, Container, Location } from "@/lib/server/models";
import { CSV_FIELDS, FIELD_LABELS, type CsvField } from "../csv-fields";
import { parseContainerCsv, type ImportIssue, type ImportRow } from "../csv-import";
import { formatAmount } from "../units";
import { appendLedger, uniqueToConflict } from "./common";

export interface ImportPreview {
  headers: string[];
  mapping: Partial<Record<CsvField, string>>;
  fields: Array<{ field: CsvField; label: string }>;
  rowCount: number;
  issues: ImportIssue[];
  rows: Array<{ row: number; barcode: string; chemical: string; cas: string; amount: string; location: string | null; expiresOn: string | null; newChemical: boolean; newLocation: boolean }>;
  newChemicals: number;
  newLocations: number;
}

/** The file checked against the lab's records: barcodes already used, chemicals that would be new (and then need a name). */
async function check(labId: string, input: unknown, t?: Transaction): Promise<{ preview: ImportPreview; rows: ImportRow[] }> {
  const req = parseOrThrow(importRequestSchema, input);
  const parsed = parseContainerCsv(req.csv, req.mapping as Partial<Record<CsvField, string>> | undefined);
  const issues = [...parsed.issues];
  const cas = [...new Set(parsed.rows.map((r) => r.cas))];
  const chems = cas.length ? await Chemical.findAll({ where: { labId, cas: { [Op.in]: cas } }, attributes: ["id", "cas", "name"], transaction: t }) : [];
  const chemByCas = new Map(chems.map((c) => [c.cas!, c]));
  const barcodes = parsed.rows.map((r) => r.barcode.toLowerCase());
  const taken = barcodes.length ? await Container.findAll({ where: { labId, [Op.and]: [where(fn("lower", column("barcode")), { [Op.in]: barcodes })] }, attributes: ["barcode"], transaction: t }) : [];
  const takenSet = new Set(taken.map((c) => c.barcode.toLowerCase()));
  const locs = await Location.findAll({ where: { labId }, attributes: ["name"], transaction: t });
  const locSet = new Set(locs.map((l) => l.name.toLowerCase()));
  const col = (f: CsvField) => parsed.mapping[f] ?? f;
  const ok: ImportRow[] = [];
  const newNames = new Map<string, string>();
  for (const r of parsed.rows) {
    let bad = false;
    if (takenSet.has(r.barcode.toLowerCase())) {
      issues.push({ row: r.row, column: col("barcode"), field: "barcode", message: `barcode ${r.barcode} is already used in this lab` });
      bad = true;
    }
    if (!chemByCas.has(r.cas) && !r.name && !newNames.has(r.cas)) {
      issues.push({ row: r.row, column: col("name"), field: "name", message: `CAS ${r.cas} is not in the catalogue yet: give the chemical's name` });
      bad = true;
    }
    if (!chemByCas.has(r.cas) && r.name && !newNames.has(r.cas)) newNames.set(r.cas, r.name);
    if (!bad) ok.push(r);
  }
  const position = (i: ImportIssue) => (parsed.headers.indexOf(i.column) + 1 || parsed.headers.length + 1);
  issues.sort((a, b) => a.row - b.row || position(a) - position(b));
  const newLocations = new Set(ok.filter((r) => r.location && !locSet.has(r.location.toLowerCase())).map((r) => r.location!.toLowerCase()));
  const preview: ImportPreview = {
    headers: parsed.headers,
    mapping: parsed.mapping,
    fields: CSV_FIELDS.map((f) => ({ field: f, label: FIELD_LABELS[f] })),
    rowCount: parsed.rowCount,
    issues,
    rows: ok.slice(0, 500).map((r) => ({
      row: r.row,
      barcode: r.barcode,
      chemical: chemByCas.get(r.cas)?.name ?? r.name ?? newNames.get(r.cas) ?? "",
      cas: r.cas,
      amount: formatAmount(r.amountBase, r.dimension, r.displayUnit) + (r.concentration ? ` of ${r.concentration} ${r.concentrationUnit}` : ""),
      location: r.location,
      expiresOn: r.expiresOn,
      newChemical: !chemByCas.has(r.cas),
      newLocation: !!r.location && !locSet.has(r.location.toLowerCase()),
    })),
    newChemicals: newNames.size,
    newLocations: newLocations.size,
  };
  return { preview, rows: ok };
}

/**
 * The preview of a container CSV: the column mapping used (guessed or chosen), every
 * problem by row and column, and the rows that would be imported. It runs exactly the
 * checks the import runs (the same function), so a file it accepts imports. Writes nothing.
 * @throws AppError invalid_input when the request itself is malformed (no file).
 */
export async function previewImport(opts: { labId: string; input: unknown }, t?: Transaction): Promise<ImportPreview> {
  return (await check(opts.labId, opts.input, t)).preview;
}

/**
 * Imports a container CSV after the stockkeeper confirmed the preview: checks the file
 * again, and refuses the whole file if any row has a problem (invalid_input, one issue
 * per problem with path rows.<row>.<field>). Otherwise writes every new location,
 * chemical and container, an "imported" ledger line per container and one audit entry,
 * all in one transaction (the caller's `t` when given): all rows or none. The checks run
 * inside that transaction too.
 * @throws AppError invalid_input, conflict (a barcode taken meanwhile).
 */
export async function confirmImport(opts: { labId: string; actorUserId: string; input: unknown }, t?: Transaction) {
  return inTransaction(t, async (t) => {
    const { preview, rows } = await check(opts.labId, opts.input, t);
    if (preview.issues.length) {
      throw new AppError(
        "invalid_input",
        `The file has ${preview.issues.length} problem${preview.issues.length === 1 ? "" : "s"}; nothing was imported.`,
        preview.issues.map((i) => ({ path: i.row === 0 ? (i.field === "file" ? "csv" : `mapping.${i.field}`) : `rows.${i.row}.${i.field}`, message: i.row === 0 ? i.message : `row ${i.row}, column ${i.column}: ${i.message}` })),
      );
    }
    if (rows.length === 0) throw AppError.field("csv", "the file has no rows to import");
    const locations = new Map((await Location.findAll({ where: { labId: opts.labId }, transaction: t })).map((l) => [l.name.toLowerCase(), l.id]));
    const chems = new Map((await Chemical.findAll({ where: { labId: opts.labId, cas: { [Op.in]: [...new Set(rows.map((r) => r.cas))] } }, transaction: t })).map((c) => [c.cas!, c.id]));
    const created: string[] = [];
    let newChemicals = 0;
    let newLocations = 0;
    for (const r of rows) {
      let locationId: string | null = null;
      if (r.location) {
        locationId = locations.get(r.location.toLowerCase()) ?? null;
        if (!locationId) {
          const l = await Location.create({ labId: opts.labId, name: r.location, notes: null }, { transaction: t }).catch((e: unknown) => uniqueToConflict(e, `rows.${r.row}.location`, `Location ${r.location} (row ${r.row}) was added meanwhile; nothing was imported. Import the file again.`));
          locations.set(r.location.toLowerCase(), l.id);
          locationId = l.id;
          newLocations++;
        }
      }
      let chemicalId = chems.get(r.cas);
      if (!chemicalId) {
        const c = await Chemical.create(
          { labId: opts.labId, name: r.name!, cas: r.cas, formula: r.formula, molarMass: r.molarMass, density: r.density, physicalState: r.concentration ? "solution" : r.dimension === "volume" ? "liquid" : "solid", peroxideClass: null, storageNotes: null, lowStockBase: null, lowStockDimension: null },
          { transaction: t },
        ).catch((e: unknown) => uniqueToConflict(e, `rows.${r.row}.cas`, `CAS ${r.cas} (row ${r.row}) was added to the catalogue meanwhile; nothing was imported. Import the file again.`));
        chems.set(r.cas, c.id);
        chemicalId = c.id;
        newChemicals++;
      }
      const box = await Container.create(
        {
          labId: opts.labId,
          chemicalId,
          locationId,
          barcode: r.barcode,
          lot: r.lot,
          dimension: r.dimension,
          amountBase: r.amountBase.toString(),
          initialBase: r.amountBase.toString(),
          displayUnit: r.displayUnit,
          concentration: r.concentration,
          concentrationUnit: r.concentrationUnit,
          solvent: r.solvent,
          purityPercent: r.purityPercent,
          receivedOn: r.receivedOn,
          openedOn: r.openedOn,
          expiresOn: r.expiresOn,
          peroxideTestedOn: null,
          status: r.amountBase === 0n ? "empty" : r.status,
        },
        { transaction: t },
      ).catch((e: unknown) => uniqueToConflict(e, `rows.${r.row}.barcode`, `Barcode ${r.barcode} (row ${r.row}) was taken meanwhile; nothing was imported.`));
      await appendLedger({ labId: opts.labId, containerId: box.id, kind: "imported", deltaBase: r.amountBase, balanceBase: r.amountBase, reason: `Imported from CSV (row ${r.row})`, actorUserId: opts.actorUserId }, t);
      created.push(box.id);
    }
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "containers.imported", entityType: "container", entityId: null, after: { containers: created.length, newChemicals, newLocations, barcodes: rows.map((r) => r.barcode), containerIds: created } }, t);
    return { imported: created.length, newChemicals, newLocations, containerIds: created };
  });
}
