/** Container CSV import against the real database: preview, refusal naming row and column, atomic import. */
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { confirmImport, previewImport } from "@/inventory/server/import-containers";
import { exportContainersCsv } from "@/inventory/server/export-containers";
import { listContainers } from "@/inventory/server/containers";
import { containerLedger } from "@/inventory/server/ledger";

const LAB = SEED.labs.kestrel.id;
const KEEPER = SEED.users.stockkeeper.id;

async function count(sql: string): Promise<number> {
  const [r] = await db().query<{ n: string }>(sql, { replacements: { lab: LAB }, type: QueryTypes.SELECT });
  return Number(r!.n);
}
const counts = async () => ({
  containers: await count("SELECT COUNT(*)::text AS n FROM containers WHERE lab_id = :lab"),
  chemicals: await count("SELECT COUNT(*)::text AS n FROM chemicals WHERE lab_id = :lab"),
  locations: await count("SELECT COUNT(*)::text AS n FROM locations WHERE lab_id = :lab"),
  ledger: await count("SELECT COUNT(*)::text AS n FROM stock_ledger WHERE lab_id = :lab"),
});

describe("CSV import", () => {
  it("rejects a file with bad rows, naming row and column, and writes nothing", async () => {
    const tag = randomUUID().slice(0, 6);
    const csv = [
      "Name,CAS,Barcode,Amount,Unit,Location",
      `Good one,7732-18-5,IMP-${tag}-1,1,L,Import shelf ${tag}`,
      `No CAS,,IMP-${tag}-2,1,g,`,
      `Bad digit,109-99-8,IMP-${tag}-3,1,L,`,
      `Negative,123-91-1,IMP-${tag}-4,-2,mL,`,
      `Odd unit,123-91-1,IMP-${tag}-5,3,pints,`,
      `Seeded barcode,123-91-1,KB-000101,3,mL,`,
    ].join("\n");
    const before = await counts();
    const preview = await previewImport({ labId: LAB, input: { csv } });
    expect(preview.issues.map((i) => [i.row, i.column])).toEqual([
      [2, "CAS"],
      [3, "CAS"],
      [4, "Amount"],
      [5, "Unit"],
      [6, "Barcode"],
    ]);
    expect(preview.rows.map((r) => r.row)).toEqual([1]);
    await expect(confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv } })).rejects.toMatchObject({
      code: "invalid_input",
      issues: [
        { path: "rows.2.cas" },
        { path: "rows.3.cas", message: expect.stringContaining("row 3, column CAS") },
        { path: "rows.4.amount" },
        { path: "rows.5.unit" },
        { path: "rows.6.barcode" },
      ],
    });
    expect(await counts()).toEqual(before);
  });

  it("imports a good file atomically: containers, new chemicals and locations, ledger lines", async () => {
    const tag = randomUUID().slice(0, 6);
    const csv = [
      "Chemical;CAS number;Label;Qty;Units;Store;Expiry date;Concentration;Conc unit",
      `Sodium chloride;7647-14-5;CSV-${tag}-1;250.5;g;Shelf ${tag};2028-01-31;;`,
      `Lithium chloride solution;7447-41-8;CSV-${tag}-2;100;mL;Shelf ${tag};;0.5;M`,
    ].join("\n");
    const before = await counts();
    const preview = await previewImport({ labId: LAB, input: { csv, mapping: { concentration_unit: "Conc unit" } } });
    expect(preview.issues).toEqual([]);
    expect(preview.mapping).toMatchObject({ name: "Chemical", cas: "CAS number", barcode: "Label", amount: "Qty", unit: "Units", location: "Store", expiry: "Expiry date" });
    expect(await counts()).toEqual(before); // preview writes nothing
    const result = await confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv, mapping: { concentration_unit: "Conc unit" } } });
    expect(result.imported).toBe(2);
    const after = await counts();
    expect(after.containers - before.containers).toBe(2);
    expect(after.ledger - before.ledger).toBe(2);
    expect(after.locations - before.locations).toBe(1);
    const found = await listContainers({ labId: LAB, query: { q: `CSV-${tag}` , sort: "barcode" } });
    expect(found.rows.map((r) => [r.barcode, r.amount.base, r.concentration])).toEqual([
      [`CSV-${tag}-1`, "250500000", null],
      [`CSV-${tag}-2`, "100000000", "0.500000"],
    ]);
    const ledger = await containerLedger({ labId: LAB, containerId: found.rows[0]!.id });
    expect(ledger.map((l) => [l.kind, l.balance.display])).toEqual([["imported", "250.5 g"]]);
    // The same file again: every barcode is taken now → refused, nothing written.
    await expect(confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv } })).rejects.toMatchObject({ code: "invalid_input" });
    expect(await counts()).toEqual(after);
  });

  it("exports every container with formula-like cells neutralised", async () => {
    const tag = randomUUID().slice(0, 6);
    const csv = `Name,CAS,Barcode,Amount,Unit,Lot\n=HYPERLINK("x") ${tag},7440-44-0,@CSV-${tag},5,g,-LOT1\n`;
    await confirmImport({ labId: LAB, actorUserId: KEEPER, input: { csv } });
    const out = await exportContainersCsv({ labId: LAB });
    const line = out.split("\r\n").find((l) => l.includes(`CSV-${tag}`));
    expect(line).toContain(`"'=HYPERLINK(""x"") ${tag}"`);
    expect(line).toContain(`'@CSV-${tag}`);
    expect(line).toContain("'-LOT1");
    expect(out.split("\r\n")[0]).toBe("name,cas,barcode,amount,unit,location,lot,purity,concentration,concentration_unit,solvent,received,opened,expiry,status,formula,molar_mass,density");
  });
});
