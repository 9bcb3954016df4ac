/**
 * The columns of a container CSV (import and export use the same ones) and the header
 * names recognised for each when guessing a column mapping.
 */
export const CSV_FIELDS = [
  "name",
  "cas",
  "barcode",
  "amount",
  "unit",
  "location",
  "lot",
  "purity",
  "concentration",
  "concentration_unit",
  "solvent",
  "received",
  "opened",
  "expiry",
  "status",
  "formula",
  "molar_mass",
  "density",
] as const;
export type CsvField = (typeof CSV_FIELDS)[number];

export const REQUIRED_FIELDS: readonly CsvField[] = ["cas", "barcode", "amount", "unit"];

export const FIELD_LABELS: Record<CsvField, string> = {
  name: "Chemical name",
  cas: "CAS number",
  barcode: "Barcode",
  amount: "Amount",
  unit: "Unit",
  location: "Location",
  lot: "Lot",
  purity: "Purity (%)",
  concentration: "Concentration",
  concentration_unit: "Concentration unit (M or mg/mL)",
  solvent: "Solvent",
  received: "Received (YYYY-MM-DD)",
  opened: "Opened (YYYY-MM-DD)",
  expiry: "Expiry (YYYY-MM-DD)",
  status: "Status",
  formula: "Formula",
  molar_mass: "Molar mass (g/mol)",
  density: "Density (g/mL)",
};

const SYNONYMS: Record<CsvField, string[]> = {
  name: ["name", "chemical", "chemicalname", "substance", "reagent", "product"],
  cas: ["cas", "casnumber", "casno", "casrn", "casregistrynumber"],
  barcode: ["barcode", "containerbarcode", "label", "containerid", "code"],
  amount: ["amount", "quantity", "qty", "size"],
  unit: ["unit", "units", "uom", "amountunit"],
  location: ["location", "store", "storage", "cabinet", "shelf"],
  lot: ["lot", "lotnumber", "batch", "lotno"],
  purity: ["purity", "assay", "puritypercent"],
  concentration: ["concentration", "conc", "molarity"],
  concentration_unit: ["concentrationunit", "concunit"],
  solvent: ["solvent"],
  received: ["received", "receivedon", "datereceived", "receiptdate"],
  opened: ["opened", "openedon", "dateopened"],
  expiry: ["expiry", "expires", "expiryDate", "expirydate", "expireson", "bestbefore", "expiration"].map((s) => s.toLowerCase()),
  status: ["status", "state"],
  formula: ["formula", "molecularformula"],
  molar_mass: ["molarmass", "mw", "molecularweight", "molarmassgmol"],
  density: ["density", "densitygml"],
};

const normalise = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, "");

/** A guessed mapping from each field to one of the file's headers (or nothing). */
export function guessMapping(headers: string[]): Partial<Record<CsvField, string>> {
  const mapping: Partial<Record<CsvField, string>> = {};
  const used = new Set<string>();
  for (const field of CSV_FIELDS) {
    const hit = headers.find((h) => !used.has(h) && SYNONYMS[field].includes(normalise(h)));
    if (hit !== undefined) {
      mapping[field] = hit;
      used.add(hit);
    }
  }
  return mapping;
}
