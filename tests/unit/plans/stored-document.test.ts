/**
 * The stored form of a plan document (lib/plans/document.ts): the lab's settings fill only
 * what the document does not give; the result is what the engine's own schema makes of it;
 * storing a stored document again changes nothing, so export → import keeps the hash.
 * The example document is the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { DEFAULT_VESSELS } from "@/lib/hazards/vessels";
import { labSettingsSchema, readLabSettings, type LabSettings } from "@/lib/lab-settings/schemas";
import { contentHash } from "@/lib/plans/content-hash";
import { storedDocument, withLabDefaults } from "@/lib/plans/document";
import { AppError } from "@/lib/errors/app-error";

const example = JSON.parse(readFileSync(new URL("../../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown>;
const defaults: LabSettings = labSettingsSchema.parse({});
const seed = () => 424242;

/** The lab of this test: its own thresholds, dispensing limits and a cooling block as default. */
const lab: LabSettings = readLabSettings({
  thresholds: { safetyFactor: 0.4, signOffTemperatureC: 100, peroxideTestIntervalMonths: { A: 2 } },
  dispensing: { minPipetteVolumeUl: 5, deadVolumeUl: 80 },
  blocks: { defaultId: "cold-24", types: [...defaults.blocks.types, { id: "cold-24", name: "Cold block", positions: 24, mode: "cooling", minC: -40, maxC: 30 }] },
});

function bare(): Record<string, unknown> {
  const { thresholds: _t, equipment: _e, dispensing: _d, vessel: _v, ...rest } = structuredClone(example);
  return rest;
}

async function failurePaths(p: Promise<unknown>): Promise<string[]> {
  try {
    await p;
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") return e.issues.map((i) => i.path);
    throw e;
  }
  throw new Error("expected an invalid_input AppError");
}

describe("lab defaults of a new plan", () => {
  it("fills vessel, block, equipment, dispensing and thresholds from the lab when the document gives none", async () => {
    const { document } = await storedDocument(bare(), lab, seed);
    expect(document.vessel).toEqual(DEFAULT_VESSELS.find((v) => v.id === "vial-4ml-screw-septum"));
    expect(document.block).toEqual({ id: "cold-24", name: "Cold block", positions: 24 });
    expect(document.equipment).toEqual({ coolingMinC: -40, blockMaxC: 30 });
    expect(document.dispensing).toEqual({ ...defaults.dispensing, minPipetteVolumeUl: 5, deadVolumeUl: 80 });
    expect(document.thresholds.safetyFactor).toBe(0.4);
    expect(document.thresholds.signOffTemperatureC).toBe(100);
    expect(document.thresholds.peroxideTestIntervalMonths).toEqual({ ...defaults.thresholds.peroxideTestIntervalMonths, A: 2 });
  });

  it("keeps every value the document gives, field by field", async () => {
    const raw = { ...bare(), thresholds: { safetyFactor: 0.3, peroxideTestIntervalMonths: { B: 6 } }, dispensing: { overagePercent: 20 }, equipment: { blockMaxC: 120 } };
    const { document } = await storedDocument(raw, lab, seed);
    expect(document.thresholds.safetyFactor).toBe(0.3);
    expect(document.thresholds.signOffTemperatureC).toBe(100);
    expect(document.thresholds.peroxideTestIntervalMonths.A).toBe(2);
    expect(document.thresholds.peroxideTestIntervalMonths.B).toBe(6);
    expect(document.dispensing.overagePercent).toBe(20);
    expect(document.dispensing.deadVolumeUl).toBe(80);
    expect(document.equipment).toEqual({ coolingMinC: -40, blockMaxC: 120 });
  });

  it("expands a vessel or block named by id into the lab's record, and refuses ids the lab does not have", async () => {
    const { document } = await storedDocument({ ...bare(), vessel: "vial-8ml-screw-septum", block: "block-al-48" }, lab, seed);
    expect(document.vessel).toMatchObject({ id: "vial-8ml-screw-septum", totalVolumeMl: 8 });
    expect(document.block).toEqual({ id: "block-al-48", name: "Aluminium heating block, 48 positions (2 mL vials)", positions: 48 });
    expect(document.equipment).toEqual({ coolingMinC: 20, blockMaxC: 150 });
    expect(await failurePaths(storedDocument({ ...bare(), vessel: "no-such-vial" }, lab, seed))).toEqual(["document.vessel"]);
    expect(await failurePaths(storedDocument({ ...bare(), block: "no-such-block" }, lab, seed))).toEqual(["document.block"]);
  });

  it("a document's own vessel type and settings stay exactly as given", async () => {
    const { document } = await storedDocument(structuredClone(example), lab, seed);
    expect(document.vessel).toEqual(example.vessel);
    expect(document.equipment).toEqual(example.equipment);
    expect(document.dispensing).toEqual(example.dispensing);
  });
});

describe("the stored form", () => {
  it("is what the engine's schema makes of the document, and re-storing it (export → import) keeps the hash", async () => {
    const first = await storedDocument(structuredClone(example), defaults, seed);
    expect(first.document).toEqual(planDocumentSchema.parse(withLabDefaults(structuredClone(example), defaults)));
    expect(first.contentHash).toBe(contentHash(first.document));
    const exported = JSON.parse(JSON.stringify(first.document)) as Record<string, unknown>;
    const again = await storedDocument(exported, lab, () => 1);
    expect(again.document).toEqual(first.document);
    expect(again.contentHash).toBe(first.contentHash);
  });

  it("fixes a seed for a randomised design that has none, and keeps a given seed", async () => {
    const raw = structuredClone(example);
    delete (raw.design as Record<string, unknown>).seed;
    expect((await storedDocument(raw, defaults, seed)).document.design.seed).toBe(424242);
    expect((await storedDocument(structuredClone(example), defaults, seed)).document.design.seed).toBe(7);
    const fixed = structuredClone(example);
    (fixed.design as Record<string, unknown>).randomize = false;
    delete (fixed.design as Record<string, unknown>).seed;
    expect((await storedDocument(fixed, defaults, seed)).document.design.seed).toBeUndefined();
  });

  it("names every bad field under document.", async () => {
    const raw = structuredClone(example) as { factors: Array<Record<string, unknown>>; recipe: { scaleMmol: unknown } };
    raw.factors[0]!.high = "hot";
    raw.recipe.scaleMmol = -1;
    expect((await failurePaths(storedDocument(raw as unknown as Record<string, unknown>, defaults, seed))).sort()).toEqual(["document.factors.0.high", "document.recipe.scaleMmol"]);
  });

  it("turns SMILES-only components into formulas before storing (the plan verb's resolvePlanSmiles)", async () => {
    const raw = structuredClone(example) as { recipe: { components: Array<Record<string, unknown>> } };
    const c = raw.recipe.components[0]!;
    delete c.formula;
    delete c.molarMassGPerMol;
    c.smiles = "CC(C)c1ccc(Br)cc1"; // 1-bromo-4-isopropylbenzene, C9H11Br
    const { document } = await storedDocument(raw as unknown as Record<string, unknown>, defaults, seed);
    expect(document.recipe.components[0]!.formula).toBe("C9H11Br");
  }, 60_000); // openchemlib loads on first use: slow on a busy machine
});
