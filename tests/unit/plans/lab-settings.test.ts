/**
 * Lab settings (lib/lab-settings/schemas.ts): composed from the engines' own schemas, so a
 * lab that saved nothing gets exactly the engines' defaults (lib/hazards/thresholds.ts,
 * lib/hazards/vessels.ts, lib/chemistry dispensingSchema), and each section is validated
 * by the engine's rules with paths into the section.
 */
import { describe, expect, it } from "vitest";
import { dispensingSchema } from "@/lib/chemistry/plan-document";
import { DEFAULT_LAB_THRESHOLDS } from "@/lib/hazards/thresholds";
import { DEFAULT_VESSELS } from "@/lib/hazards/vessels";
import { SETTINGS_SECTION_PERMISSION, SETTINGS_SECTIONS, labSettingsSchema, readLabSettings, settingsUpdateSchema } from "@/lib/lab-settings/schemas";
import { can } from "@/lib/auth/permissions";
import { parseOrThrow } from "@/lib/errors/app-error";
import { invalidPaths } from "../../support/invalid-paths";

describe("lab settings", () => {
  it("defaults to the engines' own defaults", () => {
    const s = labSettingsSchema.parse({});
    expect(s.thresholds).toEqual(DEFAULT_LAB_THRESHOLDS);
    expect(s.dispensing).toEqual(dispensingSchema.parse({}));
    expect(s.vessels.types).toEqual(DEFAULT_VESSELS);
    expect(s.vessels.types.map((v) => v.id)).toContain(s.vessels.defaultId);
    expect(s.blocks.types.map((b) => b.id)).toContain(s.blocks.defaultId);
    // Common practice (stated in lib/lab-settings/schemas.ts): block formats of 24, 48 and 96 positions; aluminium blocks 150 °C routine.
    expect(s.blocks.types.map((b) => b.positions).sort((a, b) => a - b)).toEqual([24, 24, 48, 96]);
    expect(Math.max(...s.blocks.types.filter((b) => b.mode === "heating").map((b) => b.maxC))).toBe(150);
  });

  it("reads partial or outdated stored settings section by section", () => {
    const s = readLabSettings({ thresholds: { safetyFactor: 0.4 }, dispensing: { minPipetteVolumeUl: "ten" } });
    expect(s.thresholds.safetyFactor).toBe(0.4);
    expect(s.thresholds.signOffTemperatureC).toBe(DEFAULT_LAB_THRESHOLDS.signOffTemperatureC);
    expect(s.dispensing).toEqual(dispensingSchema.parse({}));
  });

  it("checks a vessel type with the hazard engine's rules, naming the field", () => {
    const vessels = labSettingsSchema.parse({}).vessels;
    const bad = { defaultId: vessels.types[0]!.id, types: [{ ...vessels.types[0]!, workingMaxMl: 50 }, { ...vessels.types[1]!, id: vessels.types[0]!.id }] };
    expect(invalidPaths(() => parseOrThrow(settingsUpdateSchema("vessels"), { version: 1, value: bad })).sort()).toEqual(["value.types.0.workingMaxMl", "value.types.1.id"]);
    expect(invalidPaths(() => parseOrThrow(settingsUpdateSchema("vessels"), { version: 1, value: { ...vessels, defaultId: "nope" } }))).toEqual(["value.defaultId"]);
  });

  it("a block has 24, 48 or 96 positions and a range whose top is above its bottom", () => {
    const blocks = labSettingsSchema.parse({}).blocks;
    const one = (b: Record<string, unknown>) => invalidPaths(() => parseOrThrow(settingsUpdateSchema("blocks"), { version: 1, value: { defaultId: blocks.types[0]!.id, types: [{ ...blocks.types[0]!, ...b }] } }));
    expect(one({ positions: 12 })).toEqual(["value.types.0.positions"]);
    expect(one({ minC: 100, maxC: 50 })).toEqual(["value.types.0.maxC"]);
    expect(one({ mode: "both" })).toEqual(["value.types.0.mode"]);
  });

  it("thresholds use the hazard engine's bounds (a safety factor above 1 is refused)", () => {
    expect(invalidPaths(() => parseOrThrow(settingsUpdateSchema("thresholds"), { version: 1, value: { safetyFactor: 1.5 } }))).toEqual(["value.safetyFactor"]);
    expect(invalidPaths(() => parseOrThrow(settingsUpdateSchema("thresholds"), { value: {} }))).toEqual(["version"]);
  });

  it("lab admins edit equipment and limits, safety officers the thresholds, no one else (PRODUCT.md roles)", () => {
    for (const section of SETTINGS_SECTIONS) {
      const p = SETTINGS_SECTION_PERMISSION[section];
      expect(can("lab_admin", p)).toBe(section !== "thresholds");
      expect(can("safety_officer", p)).toBe(section === "thresholds");
      for (const role of ["chemist", "stockkeeper", "viewer"] as const) expect(can(role, p)).toBe(false);
    }
  });
});
