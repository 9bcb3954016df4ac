/**
 * The plan editor puts every issue on the field that holds the value (components/plans/
 * editor/form-paths.ts). The issues here are not written by hand: each comes from the
 * server's own code on a document with one thing wrong — the plan document's schema
 * through `storedDocument` (what POST/PUT/preview answer with a 422, paths under
 * `document.`) and the engines through `evaluatePlan` (design and hazard engine errors
 * mapped to document paths) — and must land on the field the chemist typed it in.
 * The document is the demo's Suzuki screen (examples/plan-suzuki.json, docs/chemistry.md).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readLabSettings } from "@/lib/lab-settings/schemas";
import { storedDocument } from "@/lib/plans/document";
import { evaluatePlan } from "@/lib/plans/evaluate";
import { AppError, type FieldIssue } from "@/lib/errors/app-error";
import { fromDocument, toDocument } from "@/components/plans/editor/form-document";
import { FORM_LEVEL, SETTINGS_FIELD, placeIssue, placeIssues } from "@/components/plans/editor/form-paths";
import type { EditorValues } from "@/components/plans/editor/form-values";

const settings = readLabSettings({});
const example = JSON.parse(readFileSync(new URL("../../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown>;
type Doc = Record<string, unknown> & { recipe: Record<string, unknown> & { components: Array<Record<string, unknown>>; solvents: Array<Record<string, unknown>> }; factors: Array<Record<string, unknown>>; design: Record<string, unknown> };

/** The example with one change, as the editor's form values hold it and as the document the editor sends. */
function edited(change: (d: Doc) => void): { values: EditorValues; sent: Record<string, unknown> } {
  const doc = structuredClone(example) as Doc;
  change(doc);
  const { values } = fromDocument(doc, settings, 1);
  return { values, sent: toDocument(values) };
}

/** The server's 422 issues for a document (storedDocument, as POST /plans and the preview run it). */
async function serverIssues(sent: Record<string, unknown>): Promise<FieldIssue[]> {
  try {
    const stored = await storedDocument(sent, settings, () => 1);
    const ev = evaluatePlan(stored.document);
    return ev.problem?.issues ?? [];
  } catch (e) {
    if (e instanceof AppError) return e.issues;
    throw e;
  }
}

async function placed(change: (d: Doc) => void) {
  const { values, sent } = edited(change);
  const issues = await serverIssues(sent);
  expect(issues.length, "the server refuses the document").toBeGreaterThan(0);
  for (const i of issues) expect(i.path.startsWith("document"), `server paths are under document. (${i.path})`).toBe(true);
  return { issues, places: issues.map((i) => placeIssue(i, values)), values };
}

describe("server issues land on the field that holds the value", () => {
  it("a factor's high below its low → that factor's high", async () => {
    const { issues, places } = await placed((d) => (d.factors[1]!.high = 1.0));
    expect(issues.map((i) => i.path)).toContain("document.factors.1.high");
    expect(places.map((p) => p.field)).toContain("factors.1.high");
  });

  it("a neat liquid without its density → the density field of that component", async () => {
    const { places } = await placed((d) => delete (d.recipe.components[0]!.form as Record<string, unknown>).densityGPerMl);
    expect(places.map((p) => p.field)).toEqual(["recipe.components.0.form.densityGPerMl"]);
  });

  it("a malformed GHS statement in a list → the component's GHS field, naming the entry", async () => {
    const { places } = await placed((d) => ((d.recipe.components[2]!.hazards as Record<string, unknown>).ghs = ["H315", "H9x9", "H335"]));
    expect(places).toEqual([{ field: "recipe.components.2.hazards.ghs", message: expect.stringContaining("“H9x9”") }]);
  });

  it("solvent fractions that do not sum to 1 → the solvents as a whole", async () => {
    const { places } = await placed((d) => (d.recipe.solvents[1]!.volumeFraction = 0.3));
    expect(places.map((p) => p.field)).toEqual(["recipe.solvents"]);
  });

  it("a stock solvent that is not a solvent of the recipe → that component's stock solvent", async () => {
    const { issues, places } = await placed((d) => (d.recipe.components[2]!.stockSolvent = "toluene"));
    expect(issues.map((i) => i.path)).toEqual(["document.recipe.components.2.stockSolvent"]);
    expect(places.map((p) => p.field)).toEqual(["recipe.components.2.stockSolvent"]);
  });

  it("a solvent listed twice → the second one's name", async () => {
    const { places } = await placed((d) => {
      d.recipe.solvents[1]!.name = "1,4-dioxane";
    });
    expect(places.map((p) => p.field)).toContain("recipe.solvents.1.name");
  });

  it("a catalyst without its loading → the loading field (shown for catalysts)", async () => {
    const { places } = await placed((d) => delete d.recipe.components[3]!.loadingMolPercent);
    expect(places.map((p) => p.field)).toEqual(["recipe.components.3.loadingMolPercent"]);
  });

  it("a binding naming no component → the factor's “drives” field", async () => {
    const { places } = await placed((d) => (d.factors[2]!.binding = { kind: "equivalents", component: "nothing" }));
    expect(places.map((p) => p.field)).toContain("factors.2.binding");
  });

  it("a generator the design engine refuses → the generators field", async () => {
    const { issues, places } = await placed((d) => (d.design.generators = ["E=ABCZ"]));
    expect(issues[0]!.path.startsWith("document.design.generators")).toBe(true);
    expect(places.map((p) => p.field)).toEqual(["design.generators"]);
  });

  it("a numeric α the design engine refuses → the α value field", async () => {
    const { issues, places } = await placed((d) => {
      d.design = { design: "central-composite", alpha: -2, centerPoints: 3, seed: 7 };
      d.factors = d.factors.slice(0, 3);
    });
    expect(issues.map((i) => i.path)).toContain("document.design.alpha");
    expect(places.map((p) => p.field)).toContain("design.alphaValue");
  });

  it("amounts that cannot work (the engine's infeasible plan) → the factor whose level causes it", async () => {
    const { places } = await placed((d) => {
      d.factors[3]!.low = 0.000001;
      d.factors[3]!.high = 0.000002;
      d.design = { design: "central-composite", alpha: 30, centerPoints: 1, seed: 7 };
      d.factors = [d.factors[3]!, d.factors[0]!];
    });
    // The engine names the factor level behind the impossible amount (validate-plan.ts factorPointPath).
    expect(places.map((p) => p.field)).toContain("factors.0.low");
  });
});

describe("paths no field holds go to the nearest card or section", () => {
  const { values } = fromDocument(example, settings, 1);
  it("vessel, block and limits", () => {
    expect(placeIssue({ path: "document.vessel.workingMaxMl", message: "m" }, values)).toEqual({ field: "vessel", message: "workingMaxMl: m" });
    expect(placeIssue({ path: "document.equipment.coolingMinC", message: "m" }, values).field).toBe("block");
    expect(placeIssue({ path: "document.thresholds.safetyFactor", message: "m" }, values)).toEqual({ field: SETTINGS_FIELD, message: "thresholds.safetyFactor: m" });
  });
  it("a component that does not exist, a field of the other physical state, and the document itself", () => {
    expect(placeIssue({ path: "document.recipe.components.9.name", message: "m" }, values).field).toBe("recipe.components");
    // Component 1 is a solid: a molarity issue goes to its state.
    expect(placeIssue({ path: "document.recipe.components.1.form.molarityM", message: "m" }, values)).toEqual({ field: "recipe.components.1.form.state", message: "molarityM: m" });
    expect(placeIssue({ path: "document", message: "m" }, values).field).toBe(FORM_LEVEL);
    expect(placeIssue({ path: "document.schemaVersion", message: "m" }, values).field).toBe(FORM_LEVEL);
  });
  it("the limiting reagent's concentration follows the basis the chemist chose", () => {
    const byVolume: EditorValues = { ...values, recipe: { ...values.recipe, basis: "volume" } };
    expect(placeIssue({ path: "document.recipe.concentrationM", message: "m" }, values).field).toBe("recipe.concentrationM");
    expect(placeIssue({ path: "document.recipe.concentrationM", message: "m" }, byVolume).field).toBe("recipe.finalVolumeUl");
  });
  it("the browser's own paths (no document. prefix) land on the same fields", () => {
    expect(placeIssues([{ path: "factors.1.high", message: "a" }, { path: "document.factors.1.high", message: "a" }], values)).toEqual(new Map([["factors.1.high", ["a"]]]));
  });
});

describe("form values ↔ document", () => {
  it("the example survives the round trip: the same stored document, except the lab's settings the server fills in", async () => {
    const { values, notes } = fromDocument(example, settings, 1);
    const { thresholds: _t, equipment: _e, dispensing: _d, ...rest } = example;
    const want = await storedDocument(rest, settings, () => 1);
    const got = await storedDocument(toDocument(values), settings, () => 1);
    expect(got.document).toEqual(want.document);
    expect(got.contentHash).toBe(want.contentHash);
    // The demo's vessel is not one of the default lab's: it is carried as the document's own.
    expect(values.vessel).toBe("__document");
    expect(notes.some((n) => n.includes("dispensing limits"))).toBe(true);
  });
});
