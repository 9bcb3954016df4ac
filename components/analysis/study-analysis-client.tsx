"use client";

import { useState } from "react";
import type { AnalysisParams } from "@/lib/hooks/use-analysis";
import type { StudyResponse } from "@/lib/studies/schemas";
import { AnalysisClient } from "./analysis-client";

/** Several plans of one study analysed together: pick the plans (each a block), then the analysis. */
export function StudyAnalysisClient({ labSlug, studyId, plans, initial, responses, canExclude, factorUnits, initialModel }: { labSlug: string; studyId: string; plans: { id: string; name: string; state: string; runCount: number | null }[]; initial: string[]; responses: StudyResponse[]; canExclude: boolean; factorUnits: Record<string, string>; initialModel: AnalysisParams["model"] }) {
  const [chosen, setChosen] = useState<string[]>(initial.filter((id) => plans.some((p) => p.id === id)));
  return (
    <div className="flex flex-col gap-4">
      <fieldset className="flex flex-col gap-1 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="plan-picker">
        <legend className="px-1 text-ink-soft">Plans in the analysis (each is a block)</legend>
        {plans.map((p) => (
          <label key={p.id} className="flex items-center gap-2">
            <input type="checkbox" checked={chosen.includes(p.id)} onChange={(e) => setChosen((c) => (e.target.checked ? [...plans.map((x) => x.id).filter((id) => c.includes(id) || id === p.id)] : c.filter((id) => id !== p.id)))} data-testid={`pick-${p.id}`} />
            <span>{p.name}</span>
            <span className="num text-ink-faint">
              {p.runCount ?? "—"} runs · {p.state.replace(/_/g, " ")}
            </span>
          </label>
        ))}
        {plans.length === 0 && <p className="text-ink-faint">No plan of this study has results yet.</p>}
      </fieldset>
      {chosen.length > 0 ? (
        <AnalysisClient key={chosen.join(",")} labSlug={labSlug} source={{ kind: "study", studyId, plans: chosen }} responses={responses} canExclude={canExclude} factorUnits={factorUnits} initialModel={initialModel} />
      ) : (
        <p className="text-sm text-ink-soft">Tick at least one plan.</p>
      )}
    </div>
  );
}
