import "server-only";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { releasePlan } from "@/lib/plans/server/release-plan";
import { createConfirmationPlan } from "@/lib/results/server/create-confirmation-plan";
import { putResults } from "@/lib/results/server/put-results";
import { demoStep } from "../step";
import { boxBehnkenResult } from "../study-a-results";

/**
 * Issue 13's demo: Study A's Box–Behnken plan (approved in step 50) is released by the demo
 * chemist, its results entered — invented numbers (lib/demo/study-a-results.ts) with a curved
 * surface whose maximum lies inside the cube, near 101.5 °C, 2.55 equiv base and 1.57 mol %
 * Pd — and, from its quadratic analysis, the confirmation plan: three replicate runs at the
 * optimum rounded to 1 °C, 0.05 equiv and 0.1 mol % (101 °C, 2.55 equiv, 1.6 mol %), checked
 * again against the envelope, a draft waiting for review. The release mails the chemist the
 * prep sheet and worklist (job queue).
 *
 * Records: studyA.confirmation.
 */
export default demoStep(
  "Study A's Box–Behnken plan: released, results entered (a curved surface), confirmation plan drafted",
  async (ctx, t) => {
    const chemist = { labId: ctx.lab.id, actorUserId: ctx.users.chemist };
    const planId = ctx.recall("studyA.boxBehnken");
    const released = await releasePlan({ ...chemist, planId }, t);
    const runs = resolveRuns(released.document).map((r) => ({ run: r.standardOrder, responses: boxBehnkenResult(r.standardOrder, r.coded) }));
    const entered = await putResults({ ...chemist, planId, input: { runs } }, t);
    const { plan, confirmation } = await createConfirmationPlan({ ...chemist, planId, input: { response: "yield", replicates: 3, model: "quadratic" } }, t);
    ctx.remember("studyA.confirmation", plan.id);
    ctx.log(`Box–Behnken ${planId}: ${entered.plan.state}; confirmation ${plan.id} at ${Object.entries(confirmation.point.natural).map(([f, v]) => `${f} ${v}`).join(", ")}, predicted ${confirmation.predicted.toFixed(1)}`);
  },
  { jobQueue: true },
);
