/**
 * The pure rules of review and release (issue 11), against values worked out by hand:
 * the review queue's order (issue 11: "worst caution first, with age"), how long a plan
 * has waited, a signature's validity (issue 11: "any edit after approval voids it"), what
 * a release reserves (lines of one chemical added; volumes before masses before amounts
 * of substance), decimal text without exponents (ECMAScript Number::toString gives
 * exponents below 1e-6 and from 1e21: the text is written out here by hand), the document
 * diff the review page shows, and the timeline built from audit entries.
 */
import { describe, expect, it } from "vitest";
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import type { InventoryLine } from "@/lib/chemistry/run-sheet";
import { diffDocuments } from "@/lib/plans/diff";
import { decimalText, planRequirements } from "@/lib/plans/requirements";
import { compareQueueEntries, waitedFor, worstSeverity } from "@/lib/plans/review-queue";
import { hasValidApproval, signatureView, type SignatureRecord } from "@/lib/plans/signature";
import { buildTimeline, type TimelineEntry } from "@/lib/plans/timeline";

describe("the review queue's order", () => {
  it("puts the worst caution first, then the longest waiting", () => {
    const entries = [
      { id: "a", worst: null, submittedAt: "2026-01-01T08:00:00Z" },
      { id: "b", worst: "warning" as const, submittedAt: "2026-01-03T08:00:00Z" },
      { id: "c", worst: "blocking" as const, submittedAt: "2026-01-04T08:00:00Z" },
      { id: "d", worst: "warning" as const, submittedAt: "2026-01-02T08:00:00Z" },
      { id: "e", worst: "info" as const, submittedAt: "2026-01-01T07:00:00Z" },
    ];
    expect([...entries].sort(compareQueueEntries).map((e) => e.id)).toEqual(["c", "d", "b", "e", "a"]);
  });

  it("names the worst severity of a plan's cautions", () => {
    expect(worstSeverity([{ severity: "info" }, { severity: "warning" }, { severity: "info" }])).toBe("warning");
    expect(worstSeverity([])).toBeNull();
  });

  it("says the wait in whole minutes, hours under two days, then days", () => {
    const now = new Date("2026-01-10T12:00:00Z");
    expect(waitedFor("2026-01-10T11:59:30Z", now)).toBe("0 min");
    expect(waitedFor("2026-01-10T11:01:00Z", now)).toBe("59 min");
    expect(waitedFor("2026-01-10T11:00:00Z", now)).toBe("1 h");
    expect(waitedFor("2026-01-08T12:00:01Z", now)).toBe("47 h");
    expect(waitedFor("2026-01-07T12:00:00Z", now)).toBe("3 d");
    expect(waitedFor(null, now)).toBe("—");
  });
});

describe("a signature's validity", () => {
  const approval: SignatureRecord = { id: "s1", signerName: "Safety Officer", signedAt: "2026-01-10T12:00:00Z", decision: "approve", meaning: "approved for execution as planned", contentHash: "a".repeat(64) };

  it("holds while it is the plan's current signature over the same content", () => {
    expect(hasValidApproval(approval, { contentHash: "a".repeat(64), signatureId: "s1" })).toBe(true);
    expect(signatureView(approval, { contentHash: "a".repeat(64), signatureId: "s1" })).toMatchObject({ valid: true, decision: "approve", signedAt: "2026-01-10T12:00:00.000Z" });
  });

  it("is void once the content changed, and stays void when an edit brings the signed content back (the edit cleared it)", () => {
    expect(hasValidApproval(approval, { contentHash: "b".repeat(64), signatureId: "s1" })).toBe(false);
    expect(signatureView(approval, { contentHash: "a".repeat(64), signatureId: null })?.valid).toBe(false);
  });

  it("only an approval lets a plan be released", () => {
    expect(hasValidApproval({ ...approval, decision: "request_changes", meaning: "changes requested" }, { contentHash: "a".repeat(64), signatureId: "s1" })).toBe(false);
    expect(hasValidApproval(null, { contentHash: "a".repeat(64), signatureId: null })).toBe(false);
  });
});

describe("what a release reserves", () => {
  const line = (l: Partial<InventoryLine> & Pick<InventoryLine, "kind" | "id" | "name">): InventoryLine => ({ mmol: null, massMg: null, volumeUl: null, ...l }) as InventoryLine;
  const document = {
    recipe: {
      components: [
        { id: "base", name: "Base", chemicalId: "chem-base" },
        { id: "cat", name: "Catalyst" }, // names no chemical: nothing reserved
        { id: "amine", name: "Amine", chemicalId: "chem-amine" },
      ],
      solvents: [{ name: "dioxane", chemicalId: "chem-dioxane" }, { name: "water" }],
    },
  } as unknown as PlanDocument;

  it("takes the volume where there is one, else the mass, else the amount of substance; adds lines of one chemical; skips what names none", () => {
    const inventory = [
      line({ kind: "component", id: "base", name: "Base", mmol: 3.6, massMg: 764.2 }),
      line({ kind: "component", id: "cat", name: "Catalyst", mmol: 0.02, massMg: 15.3 }),
      line({ kind: "component", id: "amine", name: "Amine", mmol: 2, volumeUl: 250.5 }),
      line({ kind: "solvent", id: "dioxane", name: "dioxane", volumeUl: 12000 }),
      line({ kind: "solvent", id: "dioxane", name: "dioxane", volumeUl: 600.25 }), // a top-up line of the same solvent
      line({ kind: "solvent", id: "water", name: "water", volumeUl: 3000 }),
    ];
    const reqs = planRequirements(document, { inventory });
    expect(reqs.map(({ chemicalId, amount, unit }) => ({ chemicalId, amount, unit }))).toEqual([
      { chemicalId: "chem-base", amount: "764.2", unit: "mg" },
      { chemicalId: "chem-amine", amount: "250.5", unit: "µL" },
      { chemicalId: "chem-dioxane", amount: "12600.25", unit: "µL" }, // 12000 + 600.25
    ]);
    expect(reqs[2]!.lines).toHaveLength(2);
  });

  it("writes amounts as plain decimals, never with an exponent", () => {
    expect(decimalText(764.2)).toBe("764.2");
    expect(decimalText(1e-7)).toBe("0.0000001");
    expect(decimalText(2.5e-8)).toBe("0.000000025");
    expect(decimalText(1.5e21)).toBe("1500000000000000000000");
  });
});

describe("the document diff of the review page", () => {
  const doc = (base: number, order: string[]) => ({
    name: "Screen",
    recipe: { scaleMmol: 0.2, components: order.map((id) => ({ id, name: id === "base" ? "Potassium phosphate" : "Boronic acid", equivalents: id === "base" ? base : 1.3 })) },
    factors: [{ name: "temperature", low: 60, high: 100 }],
  });

  it("matches components by id: a changed amount reads by the component's name, a reorder alone is its own line", () => {
    const changes = diffDocuments(doc(2, ["base", "ba"]), doc(2.5, ["base", "ba"]));
    expect(changes).toHaveLength(1);
    expect(changes[0]).toMatchObject({ path: "recipe.components[base].equivalents", before: "2", after: "2.5" });
    expect(changes[0]!.label).toContain("Potassium phosphate");
    const reordered = diffDocuments(doc(2, ["base", "ba"]), doc(2, ["ba", "base"]));
    expect(reordered.map((c) => c.path)).toEqual(["recipe.components"]);
    expect(reordered[0]).toMatchObject({ before: "base, ba", after: "ba, base" });
  });

  it("finds nothing between equal documents", () => {
    expect(diffDocuments(doc(2, ["base", "ba"]), doc(2, ["base", "ba"]))).toEqual([]);
  });
});

describe("the timeline", () => {
  const entry = (id: string, action: string, before: unknown, after: unknown, minute: number, entityType = "plan"): TimelineEntry => ({
    id,
    action,
    entityType,
    entityId: entityType === "plan" ? "p1" : `r${id}`,
    actorUserId: action === "plan.approved" ? "u2" : "u1",
    actorTokenId: null,
    before,
    after,
    createdAt: `2026-01-10T12:${String(minute).padStart(2, "0")}:00Z`,
  });
  const names = new Map([
    ["u1", "Chemist"],
    ["u2", "Safety Officer"],
  ]);

  it("reads each entry in order: who, what, and the state, signature, edit, stock and results changes", () => {
    const items = buildTimeline(
      [
        entry("6", "plan.results_entered", { state: "released", "run 1 yield": null }, { state: "running", "run 1 yield": 72.1, "run 2 yield": 60 }, 6),
        entry("1", "plan.created", null, { name: "Screen", state: "draft", document: { name: "Screen", recipe: { scaleMmol: 0.2 } } }, 1),
        entry("3", "plan.approved", { state: "in_review" }, { state: "approved", comment: "Shield on.", signedContentHash: "c".repeat(64) }, 3),
        entry("2", "plan.submitted", { state: "draft" }, { state: "in_review" }, 2),
        entry("4", "plan.updated", { state: "approved" }, { state: "draft", document: { name: "Screen", recipe: { scaleMmol: 0.25 } }, signatureVoided: true }, 4),
        entry("5", "reservation.created", null, { barcode: "KB-000501", amountBase: "1754000", dimension: "mass", planRef: "Screen" }, 5, "reservation"),
      ],
      { names },
    );
    expect(items.map((i) => [i.title, i.actor])).toEqual([
      ["Created the plan", "Chemist"],
      ["Submitted for review", "Chemist"],
      ["Signed: approved for execution as planned", "Safety Officer"],
      ["Edited the plan", "Chemist"],
      ["Reserved stock: KB-000501", "Chemist"],
      ["Entered results", "Chemist"],
    ]);
    const byTitle = (t: string) => items.find((i) => i.title.startsWith(t))!.changes;
    expect(byTitle("Signed")).toEqual(expect.arrayContaining([expect.objectContaining({ label: "comment", after: "Shield on." })]));
    const edit = byTitle("Edited");
    expect(edit).toEqual(expect.arrayContaining([expect.objectContaining({ label: "state", before: "Approved", after: "Draft" }), expect.objectContaining({ field: "signature", after: "voided by this edit" })]));
    expect(edit.some((c) => c.before === "0.2" && c.after === "0.25")).toBe(true);
    expect(byTitle("Reserved").map((c) => c.after)).toContain("1.754 g"); // 1 754 000 µg
    expect(byTitle("Entered")).toEqual(expect.arrayContaining([expect.objectContaining({ label: "state", after: "Running" }), expect.objectContaining({ label: "result cells changed", after: "2" })]));
  });
});
