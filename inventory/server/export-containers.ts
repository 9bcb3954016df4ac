import "server-only";
import type { Transaction } from "sequelize";
import { Chemical, Container, Location } from "@/lib/server/models";
import { CSV_FIELDS } from "../csv-fields";
import { toCsv } from "../csv-export";
import { toDecimalString } from "../decimal";
import { fromBase } from "../units";

/**
 * Every container of one lab as CSV, in the import's columns (so an export can be edited
 * and imported elsewhere), amounts exact in each container's display unit, and every
 * cell that would start a spreadsheet formula neutralised (inventory/csv-export.ts).
 */
export async function exportContainersCsv(opts: { labId: string }, t?: Transaction): Promise<string> {
  const rows = await Container.findAll({
    where: { labId: opts.labId },
    include: [
      { model: Chemical, as: "chemical", required: true },
      { model: Location, as: "location", required: false },
    ],
    order: [["barcode", "ASC"]],
    transaction: t,
  });
  const data = rows.map((c) => {
    const chem = c.chemical!;
    const values: Record<(typeof CSV_FIELDS)[number], string | null> = {
      name: chem.name,
      cas: chem.cas,
      barcode: c.barcode,
      amount: toDecimalString(fromBase(BigInt(c.amountBase), c.displayUnit), 9),
      unit: c.displayUnit,
      location: c.location?.name ?? null,
      lot: c.lot,
      purity: c.purityPercent,
      concentration: c.concentration,
      concentration_unit: c.concentrationUnit,
      solvent: c.solvent,
      received: c.receivedOn,
      opened: c.openedOn,
      expiry: c.expiresOn,
      status: c.status,
      formula: chem.formula,
      molar_mass: chem.molarMass,
      density: chem.density,
    };
    return CSV_FIELDS.map((f) => values[f]);
  });
  return toCsv(CSV_FIELDS, data);
}
