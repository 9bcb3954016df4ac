/**
 * The cache of plan evaluations (lib/plans/evaluate.ts): the same document as evaluated and
 * the same date give the same evaluation without recomputing it; anything the run sheet and
 * cautions depend on — the content, the inventory's facts applied to it, the date container
 * ages are counted from — gives a new one, equal to what the `plan` verb's engine function
 * (`planReport`) computes. The document is the demo's Suzuki–Miyaura screen
 * (examples/plan-suzuki.json).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { planReport } from "@/lib/chemistry/plan-report";
import { evaluatePlan, splitReport } from "@/lib/plans/evaluate";
import { planJsonBytes } from "@/lib/plans/plan-json";

const example = (): PlanDocumentInput => JSON.parse(readFileSync(new URL("../../../examples/plan-suzuki.json", import.meta.url), "utf8")) as PlanDocumentInput;
const plain = <T,>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

describe("evaluatePlan's cache", () => {
  it("answers the same document and date with the same evaluation, equal to planReport's", () => {
    const a = evaluatePlan(example());
    const b = evaluatePlan(example());
    expect(b.runSheet).toBe(a.runSheet); // the cached object: not recomputed
    expect(plain(a)).toEqual(plain(splitReport(planReport(example()))));
  });

  it("a fact applied from the inventory, or another date, is another evaluation", () => {
    const base = evaluatePlan(example());
    // A carcinogen statement on the aryl bromide (as the inventory would apply it) adds TL-H01.
    const linked = example();
    linked.recipe.components[0]!.hazards = { ghs: ["H315", "H319", "H350"] };
    const withFact = evaluatePlan(linked);
    expect(withFact.runSheet).not.toBe(base.runSheet);
    expect(withFact.cautions.some((c) => c.code === "TL-H01" && c.component === linked.recipe.components[0]!.name)).toBe(true);
    expect(base.cautions.some((c) => c.code === "TL-H01" && c.component === linked.recipe.components[0]!.name)).toBe(false);
    // The dioxane was tested for peroxides on 2026-09-14: 12 months later (class B, Prudent
    // Practices 2011) its test is due; the same content on that date gives TL-X01.
    const later = { ...example(), now: "2027-09-14" };
    const due = evaluatePlan(later);
    expect(due.cautions.some((c) => c.code === "TL-X01")).toBe(true);
    expect(base.cautions.some((c) => c.code === "TL-X01")).toBe(false);
    expect(plain(due)).toEqual(plain(splitReport(planReport(later))));
  });

  it("keeps each caller's inventory issues, and nobody can change what the next caller gets", () => {
    const issue = { path: "document.recipe.components.0.form.purityWtPercent", message: "container X is 99 % pure" };
    const doc = example();
    const a = evaluatePlan(doc, [issue]);
    const b = evaluatePlan(example());
    expect(a.inventoryIssues).toEqual([issue]);
    expect(b.inventoryIssues).toEqual([]);
    expect(() => (a.cautions as unknown[]).pop()).toThrow(TypeError);
    expect(b.cautions.length).toBe(a.cautions.length);
    // The caller's document is not frozen with it.
    expect(Object.isFrozen(doc.recipe)).toBe(false);
    expect(Object.isFrozen(doc.vessel)).toBe(false);
  });
});

describe("the plan's JSON body (lib/plans/plan-json.ts)", () => {
  it("is byte for byte JSON.stringify({ plan }), with a cached run sheet, without one, and with any text in the document", () => {
    const doc = example();
    doc.name = 'Quotes " and \\ backslashes, ünïcode 🧪, and a look-alike of the placeholder: tareline-run-sheet-';
    const ev = evaluatePlan(doc);
    const plan = { id: "p1", name: doc.name, document: doc, ...ev, signature: null };
    const want = new TextEncoder().encode(JSON.stringify({ plan }));
    expect(Buffer.from(planJsonBytes(plan)).equals(Buffer.from(want))).toBe(true);
    // Again (the run sheet's bytes now come from the per-object store), and for a plan without a run sheet.
    expect(Buffer.from(planJsonBytes(plan)).equals(Buffer.from(want))).toBe(true);
    const none = { ...plan, runSheet: null };
    expect(new TextDecoder().decode(planJsonBytes(none))).toBe(JSON.stringify({ plan: none }));
  });
});
