import { readFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";

// The `plan` and `molar-mass` verbs through the real command line (the README's contract:
// exit 0 success, exit 2 invalid input with `{"error":{"message","issues":[{path,message}]}}`).
interface Body {
  error?: { message: string; issues: Array<{ path: string; message: string }> };
  [key: string]: unknown;
}
function cli(verb: string, input: unknown) {
  const r = spawnSync("node_modules/.bin/tsx", ["lib/cli/main.ts", verb], {
    input: typeof input === "string" ? input : JSON.stringify(input),
    encoding: "utf8",
  });
  return { status: r.status, body: JSON.parse(r.stdout) as Body };
}
const example = () => JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as Record<string, unknown> & {
  recipe: { components: Array<Record<string, unknown>> };
  factors: Array<Record<string, unknown>>;
};

// Each call starts a tsx process (≈1.5 s, more on a loaded machine): allow 30 s per test.
describe("cli plan", { timeout: 30_000 }, () => {
  it("turns the example plan into a run sheet with cautions (exit 0)", () => {
    const r = cli("plan", example());
    expect(r.status).toBe(0);
    const runs = r.body.runs as Array<{ components: Array<{ mmol: number; massMg: number | null; volumeUl: number | null }>; dispense: unknown[] }>;
    expect(runs).toHaveLength(18); // 2^(5−1) + 2 centre points
    expect(runs[0]!.components[0]).toHaveProperty("mmol");
    expect(Array.isArray(r.body.stocks)).toBe(true);
    expect(Array.isArray(r.body.cautions)).toBe(true);
    expect(typeof r.body.releasable).toBe("boolean");
    expect(typeof r.body.signOffRequired).toBe("boolean");
    expect(r.body.notice).toMatch(/planning aids/);
  });

  it("accepts a component given only by SMILES (formula filled in before planning)", () => {
    const doc = example();
    delete doc.recipe.components[0]!.formula;
    doc.recipe.components[0]!.smiles = "CC(C)c1ccc(Br)cc1";
    const r = cli("plan", doc);
    expect(r.status).toBe(0);
    const comps = r.body.components as Array<{ id: string; molarMassGPerMol: number }>;
    expect(comps.find((c) => c.id === "arBr")!.molarMassGPerMol).toBeCloseTo(9 * 12.011 + 11 * 1.008 + 79.904, 9);
  });

  it("a component with a bad SMILES gives exit 2 at its path", () => {
    const doc = example();
    delete doc.recipe.components[1]!.formula;
    doc.recipe.components[1]!.smiles = "B(O)(O";
    const r = cli("plan", doc);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues[0]!.path).toBe("recipe.components.1.smiles");
  });

  it("bad input gives exit 2 and the dotted paths of the fields", () => {
    const doc = example();
    doc.recipe.components[0]!.form = { state: "liquid" }; // density missing
    const r = cli("plan", doc);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues.map((i) => i.path)).toContain("recipe.components.0.form.densityGPerMl");
  });

  it("a factor bound to an unknown component gives exit 2 at factors.1.binding.component", () => {
    const doc = example();
    (doc.factors[1]!.binding as { component: string }).component = "bse";
    const r = cli("plan", doc);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues.map((i) => i.path)).toContain("factors.1.binding.component");
  });

  it("an unknown vessel id gives exit 2 at path vessel", () => {
    const doc = example();
    doc.vessel = "vial-9ml";
    const r = cli("plan", doc);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues[0]!.path).toBe("vessel");
  });

  it("an impossible plan gives exit 2 naming the component and runs", () => {
    const doc = example();
    doc.recipe.components[2]!.dispense = "stock"; // K3PO4 cannot fit as a water stock in the 10 vol % runs
    const r = cli("plan", doc);
    expect(r.status).toBe(2);
    expect(r.body.error!.message).toMatch(/Potassium phosphate/);
    expect(r.body.error!.message).toMatch(/runs affected: [\d, ]+/);
  });
});

describe("cli molar-mass", { timeout: 30_000 }, () => {
  it("C9H11Br → 199.091 g/mol (IUPAC 2021: 9 × 12.011 + 11 × 1.008 + 79.904, from memory)", () => {
    const r = cli("molar-mass", { formula: "C9H11Br" });
    expect(r.status).toBe(0);
    expect(r.body.formula).toBe("C9H11Br");
    expect(r.body.gPerMol as number).toBeCloseTo(9 * 12.011 + 11 * 1.008 + 79.904, 9);
  });

  it("an unknown element gives exit 2 at path formula", () => {
    const r = cli("molar-mass", { formula: "Xx2" });
    expect(r.status).toBe(2);
    expect(r.body.error!.issues[0]!.path).toBe("formula");
  });

  it("SMILES is turned into its formula (openchemlib) and weighed with the same atomic weights", () => {
    const r = cli("molar-mass", { smiles: "CC(C)c1ccc(Br)cc1" });
    expect(r.status).toBe(0);
    expect(r.body.hillFormula).toBe("C9H11Br");
    expect(r.body.gPerMol as number).toBeCloseTo(9 * 12.011 + 11 * 1.008 + 79.904, 9);
  });

  it("a SMILES that does not parse gives exit 2 at path smiles", () => {
    const r = cli("molar-mass", { smiles: "C1CC((" });
    expect(r.status).toBe(2);
    expect(r.body.error!.issues[0]!.path).toBe("smiles");
  });
});
