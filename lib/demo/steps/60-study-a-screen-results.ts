import "server-only";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { getPlan } from "@/lib/plans/server/get-plan";
import { putResults } from "@/lib/results/server/put-results";
import { demoStep } from "../step";
import { screenResult } from "../study-a-results";

/**
 * Issue 12's demo: Study A's screen (released in step 50) has its results — invented numbers
 * (lib/demo/study-a-results.ts: temperature, base and Pd loading matter, with a temperature ×
 * Pd interaction; boronic acid and water fraction hardly do) — entered by the demo chemist
 * through the results operation, yield and homocoupling for all 18 runs. The first result
 * moves the plan to running, the last to results entered, and its held reservations are
 * consumed at the planned amounts (the inventory's ledger and audit log as the app writes
 * them). Its analysis (interactions, pruned at α = 0.05) keeps temperature, base, Pd and
 * temperature × Pd.
 */
export default demoStep("Study A's screen: results entered (invented yields), its reservations consumed", async (ctx, t) => {
  const planId = ctx.recall("studyA.screen");
  const plan = await getPlan({ labId: ctx.lab.id, planId }, t);
  const runs = resolveRuns(plan.document).map((r) => ({ run: r.standardOrder, responses: screenResult(r.standardOrder, r.coded) }));
  const entered = await putResults({ labId: ctx.lab.id, actorUserId: ctx.users.chemist, planId, input: { runs } }, t);
  ctx.log(`screen ${planId}: ${runs.length} runs entered, ${entered.plan.state}`);
});
