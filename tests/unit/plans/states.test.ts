/**
 * The plan state table (lib/plans/states.ts) against the moves written out by hand from
 * issue 11 ("The plan's states") and PRODUCT.md ("The flow of one plan"): draft → in
 * review → approved / changes requested / rejected → released → running → results
 * entered → closed; cancelled from any state before running; plans no rule flags may be
 * released without review; an edit of an approved plan returns it to draft
 * (CONTRACT.md "PUT /plans/{plan}"); a plan sent back for changes is resubmitted.
 * Every listed move must be allowed and every other ordered pair refused.
 */
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { can } from "@/lib/auth/permissions";
import { EDITABLE_STATES, PLAN_MOVES, PLAN_STATES, findMove, requireMove, stateAfterEdit, type PlanState } from "@/lib/plans/states";

const EXPECTED: Array<[PlanState, PlanState, string]> = [
  ["draft", "in_review", "submit"],
  ["changes_requested", "in_review", "submit"],
  ["in_review", "approved", "approve"],
  ["in_review", "changes_requested", "request_changes"],
  ["in_review", "rejected", "reject"],
  ["approved", "released", "release"],
  ["draft", "released", "release"],
  ["approved", "draft", "edit"],
  ["released", "running", "start"],
  ["running", "results_entered", "enter_results"],
  ["results_entered", "closed", "close"],
  ["draft", "cancelled", "cancel"],
  ["in_review", "cancelled", "cancel"],
  ["changes_requested", "cancelled", "cancel"],
  ["approved", "cancelled", "cancel"],
  ["rejected", "cancelled", "cancel"],
  ["released", "cancelled", "cancel"],
];

describe("plan state table", () => {
  it("has the ten states of CONTRACT.md", () => {
    expect([...PLAN_STATES].sort()).toEqual(
      ["draft", "in_review", "changes_requested", "approved", "rejected", "released", "running", "results_entered", "closed", "cancelled"].sort(),
    );
  });

  it("lists exactly the expected moves", () => {
    expect(PLAN_MOVES.map((m) => `${m.from}→${m.to}:${m.action}`).sort()).toEqual(EXPECTED.map(([f, t, a]) => `${f}→${t}:${a}`).sort());
  });

  for (const from of PLAN_STATES) {
    for (const to of PLAN_STATES) {
      const expected = EXPECTED.find(([f, t]) => f === from && t === to);
      it(`${from} → ${to} is ${expected ? "allowed" : "refused"}`, () => {
        expect(findMove(from, to)?.action).toBe(expected?.[2]);
      });
    }
  }

  it("nothing leaves running, results entered, closed or cancelled except forward (no cancel once running)", () => {
    for (const s of ["running", "results_entered", "closed", "cancelled"] as const) {
      expect(findMove(s, "cancelled")).toBeUndefined();
    }
  });

  it("a refused move is a conflict naming the state", () => {
    try {
      requireMove("closed", "submit");
      throw new Error("expected a conflict");
    } catch (e) {
      expect(e).toBeInstanceOf(AppError);
      expect((e as AppError).code).toBe("conflict");
      expect((e as AppError).issues.map((i) => i.path)).toEqual(["state"]);
    }
  });

  it("reviews are the safety officer's, never the author's, and need the password again", () => {
    for (const m of PLAN_MOVES.filter((m) => m.from === "in_review" && m.to !== "cancelled")) {
      expect(m.permission).toBe("plans.review");
      expect(m.guards).toContain("not_author");
      expect(m.guards).toContain("password");
      expect(can("safety_officer", m.permission)).toBe(true);
      expect(can("chemist", m.permission)).toBe(false);
    }
  });

  it("no move to released without the no-blocking-caution guard, and a draft only when no sign-off is required", () => {
    for (const m of PLAN_MOVES.filter((m) => m.to === "released")) expect(m.guards).toContain("no_blocking_caution");
    expect(findMove("draft", "released")?.guards).toContain("no_sign_off_required");
    expect(findMove("approved", "released")?.guards).toContain("valid_signature");
  });

  it("edits: drafts and plans sent back stay where they are; an approved plan returns to draft and loses its signature; others are frozen", () => {
    expect(stateAfterEdit("draft")).toEqual({ state: "draft", voidsSignature: false });
    expect(stateAfterEdit("changes_requested")).toEqual({ state: "changes_requested", voidsSignature: false });
    expect(stateAfterEdit("approved")).toEqual({ state: "draft", voidsSignature: true });
    for (const s of PLAN_STATES.filter((s) => !(s in EDITABLE_STATES))) {
      expect(() => stateAfterEdit(s)).toThrow(AppError);
    }
  });

  it("every move's permission is held by some role that plans or reviews", () => {
    for (const m of PLAN_MOVES) expect(can("chemist", m.permission) || can("safety_officer", m.permission)).toBe(true);
  });
});
