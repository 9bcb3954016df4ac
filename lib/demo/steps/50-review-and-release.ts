import "server-only";
import { releasePlan } from "@/lib/plans/server/release-plan";
import { reviewPlan } from "@/lib/plans/server/review-plan";
import { submitPlan } from "@/lib/plans/server/submit-plan";
import { DEMO_PASSWORD } from "../context";
import { demoStep } from "../step";

/**
 * Review and release in the demo (issue 11 "Demo"), through the same operations as the
 * routes, by the people whose roles make each move:
 *
 * - Study A's screen (60–100 °C, nothing asks for sign-off) is released straight from draft
 *   by the chemist: its components and solvents are reserved from the demo inventory (first
 *   to expire first, opened before sealed), held for the plan;
 * - Study A's Box–Behnken plan (its 110 °C runs are above the solvents' boiling points in a
 *   sealed vial: sign-off) is submitted by the chemist and approved by the demo safety
 *   officer, who signs with the demo password — the e-signature binds to its content hash;
 *   it waits to be released;
 * - Study B's pyrophoric exchange plan (n-butyllithium) is submitted and waits in the review
 *   queue (its release would find the n-butyllithium short: see step 30).
 *
 * The submissions and the signature mail the safety officers and the author (job queue).
 */
export default demoStep(
  "Review and release: Study A's screen released, its Box–Behnken plan approved, Study B's plan in the review queue",
  async (ctx, t) => {
    const chemist = { labId: ctx.lab.id, actorUserId: ctx.users.chemist };
    const screen = await releasePlan({ ...chemist, planId: ctx.recall("studyA.screen") }, t);
    ctx.log(`screen ${screen.id}: ${screen.state}, ${screen.reservations.filter((r) => r.status === "held").length} reservations held`);

    const bbId = ctx.recall("studyA.boxBehnken");
    await submitPlan({ ...chemist, planId: bbId }, t);
    const bb = await reviewPlan(
      {
        labId: ctx.lab.id,
        actorUserId: ctx.users.safety,
        planId: bbId,
        input: { decision: "approve", comment: "Sealed 4 mL crimp vials behind the blast shield; vent only after cooling to room temperature.", password: DEMO_PASSWORD },
      },
      t,
    );
    ctx.log(`Box–Behnken ${bb.id}: ${bb.state}, signed by ${bb.signature?.signerName ?? "nobody"}`);

    const exchange = await submitPlan({ ...chemist, planId: ctx.recall("studyB.exchange") }, t);
    ctx.log(`exchange ${exchange.id}: ${exchange.state}`);
  },
  { jobQueue: true },
);
