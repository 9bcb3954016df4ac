import { describe, expect, it } from "vitest";
import { auditChanges, fieldLabel, formatValue } from "@/lib/audit/changes";
import { actionLabel, auditQuerySchema, entityLabel } from "@/lib/audit/schemas";

/**
 * The audit log's readable changes. Expected values written by hand from the records'
 * shapes (inventory/server/chemicals.ts, containers.ts); amounts converted with the SI
 * prefixes (BIPM, The International System of Units, 9th ed. 2019, Table 7:
 * 1 g = 10^6 µg, 1 mL = 10^6 nL).
 */
describe("auditChanges", () => {
  const chemical = {
    id: "c1",
    labId: "l1",
    name: "Tetrahydrofuran",
    synonyms: ["THF"],
    cas: "109-99-9",
    molarMass: "72.1060",
    ghsStatements: ["H225", "H319"],
    pyrophoric: false,
    storageNotes: null,
    lowStockBase: "500000000",
    lowStockDimension: "volume",
    createdAt: "2026-12-01T08:00:00.000Z",
    updatedAt: "2026-12-01T08:00:00.000Z",
  };

  it("lists only the fields that changed, with both values formatted, bookkeeping left out", () => {
    const after = { ...chemical, storageNotes: "flammables cabinet", ghsStatements: ["H225", "H319", "EUH019"], lowStockBase: "250000000", updatedAt: "2026-12-02T09:30:00.000Z" };
    expect(auditChanges(chemical, after)).toEqual([
      { field: "ghsStatements", label: "GHS statements", before: "H225, H319", after: "H225, H319, EUH019" },
      { field: "storageNotes", label: "storage notes", before: null, after: "flammables cabinet" },
      // 500 000 000 nL = 500 mL; 250 000 000 nL = 250 mL.
      { field: "lowStockBase", label: "low-stock mark", before: "500 mL", after: "250 mL" },
    ]);
  });

  it("a value written differently but equal for people (database scale vs typed) is no change", () => {
    expect(auditChanges({ density: "0.8890", molarMass: "72.1100", concentration: "0.500", storageNotes: "a" }, { density: "0.889", molarMass: "72.11", concentration: "0.5", storageNotes: "b" })).toEqual([
      { field: "storageNotes", label: "storage notes", before: "a", after: "b" },
    ]);
    // Text that only looks like a number is compared as written (a lot "1.50" is not "1.5").
    expect(auditChanges({ lot: "1.50" }, { lot: "1.5" })).toEqual([{ field: "lot", label: "lot", before: "1.50", after: "1.5" }]);
  });

  it("shows yes/no for flags and units next to numbers", () => {
    expect(auditChanges({ pyrophoric: false, molarMass: "72.1060" }, { pyrophoric: true, molarMass: "72.11" })).toEqual([
      { field: "pyrophoric", label: "pyrophoric", before: "no", after: "yes" },
      { field: "molarMass", label: "molar mass", before: "72.106 g/mol", after: "72.11 g/mol" },
    ]);
  });

  it("for a record made, lists what was set and leaves out empty lists, unset fields and 'no' flags", () => {
    expect(auditChanges(null, { name: "Water", synonyms: [], cas: null, pyrophoric: false, ghsStatements: ["H319"] })).toEqual([
      { field: "name", label: "name", before: null, after: "Water" },
      { field: "ghsStatements", label: "GHS statements", before: null, after: "H319" },
    ]);
  });

  it("for a record removed, lists what it was", () => {
    expect(auditChanges({ userId: "u1", role: "chemist" }, null)).toEqual([
      { field: "userId", label: "person", before: "u1", after: null },
      { field: "role", label: "role", before: "Chemist", after: null },
    ]);
  });

  it("formats an amount by the entry's own dimension, else by the context's, else says base units", () => {
    // 2 000 000 µg = 2 g (mass given in the entry).
    expect(auditChanges(null, { amountBase: "2000000", dimension: "mass" })).toEqual([{ field: "amountBase", label: "amount", before: null, after: "2 g" }]);
    // A stock-take entry has no dimension: the container's (volume) is given as context; 99 500 000 nL = 99.5 mL.
    expect(auditChanges({ amountBase: "100000000" }, { amountBase: "99500000", reason: "counted" }, { dimension: "volume" })).toEqual([
      { field: "amountBase", label: "amount", before: "100 mL", after: "99.5 mL" },
      { field: "reason", label: "reason", before: null, after: "counted" },
    ]);
    expect(auditChanges({ amountBase: "1" }, { amountBase: "2" })[0]!.after).toBe("2 (base units)");
  });

  it("shortens long lists and formats times in UTC", () => {
    const ids = Array.from({ length: 11 }, (_, i) => `KB-${i + 1}`);
    expect(formatValue(ids)).toBe("KB-1, KB-2, KB-3, KB-4, KB-5, KB-6, KB-7, KB-8 … (3 more)");
    expect(formatValue("2026-12-02T09:30:12.345Z")).toBe("2026-12-02 09:30 UTC");
    expect(formatValue("2026-12-02")).toBe("2026-12-02");
    expect(formatValue({ status: "held", amountBase: "5", dimension: "mass" })).toBe("status: held; amount: 5 µg");
  });

  it("compares nested records and lists of records inside: one line per changed leaf, lists counted from 1", () => {
    // The shape of a lab settings entry (lib/lab-settings/server/update-lab-settings.ts) and of a plan
    // document's factors (docs/studies-and-plans.md); the expected lines written by hand.
    const blocks = (source: string, maxC: number) => ({
      section: "blocks",
      version: 3,
      value: {
        defaultId: "kb-al-24",
        types: [
          { id: "kb-al-24", name: "Aluminium heating block", positions: 24, mode: "heating", minC: 20, maxC, source },
          { id: "kb-cool-24", name: "Cooling block", positions: 24, mode: "cooling", minC: -78, maxC: 25, source: "dry ice" },
        ],
      },
    });
    expect(auditChanges(blocks("common practice", 150), { ...blocks("calibrated probe", 140), version: 4 })).toEqual([
      { field: "value.types.0.maxC", label: "value › types 1 › highest temperature", before: "150 °C", after: "140 °C" },
      { field: "value.types.0.source", label: "value › types 1 › source", before: "common practice", after: "calibrated probe" },
    ]);
    // A list of plain values is shown whole, changed in place or grown.
    const doc = (high: number, ghs: string[]) => ({ document: { factors: [{ name: "temperature", low: 85, high }], hazards: { ghs } } });
    expect(auditChanges(doc(115, ["H225", "H319"]), doc(112.65, ["H225", "H318"]))).toEqual([
      { field: "document.factors.0.high", label: "document › factors 1 › high", before: "115", after: "112.65" },
      { field: "document.hazards.ghs", label: "document › hazards › ghs", before: "H225, H319", after: "H225, H318" },
    ]);
    expect(auditChanges(doc(115, ["H225"]), doc(115, ["H225", "H319"]))).toEqual([{ field: "document.hazards.ghs", label: "document › hazards › ghs", before: "H225", after: "H225, H319" }]);
  });

  it("labels fields for people", () => {
    expect(fieldLabel("purityPercent")).toBe("purity");
    expect(fieldLabel("peroxideTestedOn")).toBe("peroxide tested on");
    expect(fieldLabel("heldDeltaBase")).toBe("held delta");
    expect(entityLabel("api_token")).toBe("API token");
    expect(entityLabel("chemical")).toBe("Chemical");
    expect(actionLabel("membership.role_changed")).toBe("role changed");
  });
});

describe("audit query", () => {
  it("accepts the filters and paging, and names a bad field", () => {
    const id = "6d1c2a10-0000-4000-8000-000000000001";
    expect(auditQuerySchema.parse({ entity: "chemical", actor: `user:${id}`, page: "2", pageSize: "50" })).toEqual({ entity: "chemical", actor: `user:${id}`, page: 2, pageSize: 50 });
    expect(auditQuerySchema.parse({})).toEqual({ entity: null, actor: null, page: 1, pageSize: 25 });
    const bad = auditQuerySchema.safeParse({ actor: "admin", page: "0", pageSize: "1000", entity: "x;drop" });
    expect(bad.success ? [] : bad.error.issues.map((i) => i.path.join(".")).sort()).toEqual(["actor", "entity", "page", "pageSize"]);
  });
});
