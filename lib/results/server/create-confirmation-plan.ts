import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { formatFactorValue } from "@/lib/doe/format";
import { inTransaction } from "@/lib/server/db";
import { createPlan } from "@/lib/plans/server/create-plan";
import type { PlanView } from "@/lib/plans/view";
import { analyzeSourcesWithModel } from "../analysis";
import { safeEnvelope } from "../envelope";
import { confirmationOf, derivedAnalysis, type ConfirmationDetails } from "../confirmation-plan";
import { analysisQueryOfBody, confirmationRequestSchema } from "../schemas";
import { planAnalysisSources } from "./read-analysis-sources";

/**
 * The confirmation plan of a plan's analysis (CONTRACT.md `POST /plans/{plan}/confirmation`
 * `{ response, replicates: 3 }`, plus the analysis query's `model`, `alpha`, `hierarchy`,
 * `transform`, settable `steps` per factor and a `name`): the analysis route's optimum for
 * that response and model, rounded to settable values (1 °C, 0.05 equiv, 0.1 mol %, 0.5 h by
 * default) and checked again against the safe envelope after rounding (blocking cautions and the lab's
 * limits, lib/results/envelope.ts — the envelope the optimum was found in) (a rounded point that
 * leaves it moves to the nearest settable point inside, and the plan says so), as a new draft
 * plan of the same study whose runs are the replicates there — derived from the plan
 * (`derivation: "confirmation"`, the analysis and the prediction in `derivationDetails`), and
 * reviewed like any other draft. The analysis of the source plan judges its results later.
 * Audited as a created plan, in the caller's transaction.
 * @throws AppError invalid_input (the body's fields; an analysis that cannot be fitted, at
 *   its parameters), not_found, conflict (no best conditions to confirm; the new plan would
 *   carry a blocking caution), infeasible at `steps.<factor>` (no settable point near the
 *   optimum inside the envelope).
 */
export async function createConfirmationPlan(
  opts: { labId: string; actorUserId: string; planId: string; input: unknown },
  t?: Transaction,
): Promise<{ plan: PlanView; confirmation: ConfirmationDetails }> {
  const v = parseOrThrow(confirmationRequestSchema, opts.input, "The confirmation plan is not valid.");
  const query = analysisQueryOfBody(v);
  return inTransaction(t, async (tx) => {
    const s = await planAnalysisSources({ labId: opts.labId, planId: opts.planId }, tx);
    const p = s.plans[0]!;
    const { answer, model } = analyzeSourcesWithModel(s.sources, s.responses, query, s.envelope);
    if (!answer.optimum) {
      const why = answer.analysis.optimumNote ?? "the analysis found no best conditions";
      throw new AppError("conflict", `There are no best conditions to confirm: ${why}`, [{ path: "response", message: why }]);
    }
    const confirmation = confirmationOf({
      model,
      optimum: answer.optimum,
      source: p.plan.document,
      analysis: derivedAnalysis(answer.analysis.response.name, query),
      replicates: v.replicates,
      ...(v.steps ? { steps: v.steps } : {}),
      safety: safeEnvelope(s.envelope!.document).check,
      name: v.name ?? `Confirmation of ${p.plan.name}`,
    });
    const plan = await createPlan(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        studyId: p.plan.studyId,
        input: { document: confirmation.document },
        derivedFrom: { planId: p.plan.id, derivation: "confirmation", details: { ...confirmation.details } },
      },
      tx,
    );
    // The plan as a whole, judged as any plan is (cautions over all its runs): a blocking one refuses it, and nothing is stored.
    const blocking = plan.cautions.filter((c) => c.severity === "blocking");
    if (blocking.length > 0) {
      const at = model.factors.map((f) => formatFactorValue(f, confirmation.plan.natural[f.name]!)).join(", ");
      throw new AppError(
        "conflict",
        `The confirmation runs at ${at} would carry a blocking caution.`,
        model.factors.map((f) => ({ path: `steps.${f.name}`, message: `${formatFactorValue(f, confirmation.plan.natural[f.name]!)}: ${blocking.map((c) => `${c.code} ${c.message}`).join("; ")}` })),
      );
    }
    return { plan, confirmation: confirmation.details };
  });
}
