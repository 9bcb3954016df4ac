import Link from "next/link";
import type { AugmentationDetails } from "@/lib/plans/augmentation";
import type { ConfirmationDetails } from "@/lib/results/confirmation-plan";
import { sig, withUnit } from "@/components/analysis/format";
import type { PlanAsideProps } from "./plan-page-slots";

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === "object" && !Array.isArray(v);

/** The stored details of a derivation (plans.derivation_details), by their kind. */
function detailsOf(v: unknown): { kind: "confirmation"; d: ConfirmationDetails } | { kind: "augmentation"; d: AugmentationDetails } | null {
  if (!isObject(v)) return null;
  if (v.kind === "confirmation" && isObject(v.point) && isObject(v.analysis)) return { kind: "confirmation", d: v as unknown as ConfirmationDetails };
  if (v.kind === "augmentation" && typeof v.alpha === "number" && Array.isArray(v.notes)) return { kind: "augmentation", d: v as unknown as AugmentationDetails };
  return null;
}

/**
 * Where a confirmation or augmentation plan comes from (the plan page's aside): the plan and
 * analysis it was derived from, the settable point and the prediction its results will be
 * judged by, or the α chosen and what the envelope made it give up.
 */
export function DerivationPanel({ plan, labSlug }: PlanAsideProps) {
  if (!plan.derivedFromPlanId || (plan.derivation !== "confirmation" && plan.derivation !== "augmentation")) return null;
  const found = detailsOf(plan.derivationDetails);
  const base = `/labs/${labSlug}/studies/${plan.studyId}`;
  const source = `${base}/plans/${plan.derivedFromPlanId}`;
  const units = Object.fromEntries(plan.document.factors.map((f) => [f.name, f.unit ?? ""]));
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" aria-label="Derived from" data-testid="plan-derivation">
      {plan.derivation === "confirmation" ? (
        <>
          <h2 className="text-base">Confirmation runs</h2>
          <p>
            Replicates at the best conditions of <Link href={`${source}/analysis`}>the analysis</Link> of <Link href={source}>the plan they confirm</Link>; their results are judged there.
          </p>
          {found?.kind === "confirmation" && (
            <>
              <p className="text-ink-soft">
                {found.d.analysis.response}, {Array.isArray(found.d.analysis.model) ? found.d.analysis.model.join(", ") : `${found.d.analysis.model} model`}
                {found.d.analysis.alpha !== null ? `, pruned at α = ${found.d.analysis.alpha}` : ""}
                {found.d.analysis.transform === "ln" ? ", ln transform" : ""}
              </p>
              <ul className="num flex flex-col gap-0.5">
                {plan.document.factors.map(({ name: f }) => (
                  <li key={f}>
                    <span className="font-mono text-xs">{f}</span> {withUnit(found.d.point.natural[f] ?? null, units[f])}
                    {found.d.steps[f] ? (
                      <span className="text-ink-faint">
                        {" "}
                        (step {sig(found.d.steps[f] ?? null)}; optimum {withUnit(found.d.optimum.natural[f] ?? null, units[f])})
                      </span>
                    ) : null}
                  </li>
                ))}
              </ul>
              <p className="num text-ink-soft">
                Predicted {sig(found.d.predicted)}; mean of {found.d.replicates} within {found.d.meanInterval95 ? `${sig(found.d.meanInterval95[0])} … ${sig(found.d.meanInterval95[1])}` : "—"} (95 %)
              </p>
              {found.d.warnings.map((w) => (
                <p key={w} className="text-caution">
                  {w}
                </p>
              ))}
            </>
          )}
        </>
      ) : (
        <>
          <h2 className="text-base">Axial and centre runs</h2>
          <p>
            The second block of a central composite design with <Link href={source}>the factorial plan</Link>;{" "}
            <Link href={`${base}/analysis?plans=${plan.derivedFromPlanId},${plan.id}`}>analyse them together</Link> once both have results.
          </p>
          {found?.kind === "augmentation" && (
            <>
              <p className="num text-ink-soft">
                α = {sig(found.d.alpha)} (rotatable {sig(found.d.rotatableAlpha)}) · {found.d.axialRuns} axial, {found.d.centerRuns} centre runs
              </p>
              <ul className="list-disc pl-4 text-ink-soft">
                {found.d.notes.map((n) => (
                  <li key={n} className={n.startsWith("Rotatability given up") || n.startsWith("α reduced") ? "text-caution" : ""}>
                    {n}
                  </li>
                ))}
              </ul>
            </>
          )}
        </>
      )}
    </section>
  );
}
