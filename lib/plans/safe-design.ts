/**
 * Safe design for a plan document (issue 10, "Safe design"): which runs of the plan's
 * design trip a blocking caution or leave the physical limits, and the alternatives a
 * chemist would consider instead, each ready to apply.
 *
 * Glue only. The verdict at a point is the hazard engine's own (`pointSafety` of
 * lib/chemistry: the blocking cautions a run there would raise, and the limits it leaves —
 * the block's temperature range, a stock above its solubility, the vial's working volume,
 * amounts or fractions that have no meaning); the alternatives and their D-efficiencies are
 * the design engine's (`safeDesignAlternatives` of lib/doe), with that verdict as its
 * `blocked` callback, so the D-optimal candidate filter runs the hazard engine on every
 * candidate. The design input is the plan's own (`planDesignInput`), so the runs judged are
 * the runs the plan would have.
 *
 * Applying an alternative gives the document the chemist sent with its `design` section
 * replaced (and, for a narrower range, the one factor changed): nothing else is touched, so
 * the editor can take it as the new form state.
 */
// First: chooses zod's interpreter before the engine schemas are built (lib/schemas/text.ts).
import { text } from "../schemas/text";
import { z } from "zod";
import { planDesignInput, resolveRuns } from "../chemistry/design-runs";
import { planDocumentSchema, type PlanDocument, type PlanDocumentInput } from "../chemistry/plan-document";
import { pointSafety, type PointSafetyResult, type SafetyFinding } from "../chemistry/point-safety";
import { ALTERNATIVE_KINDS, safeDesignAlternatives, type AlternativeKind, type DesignAlternative, type DesignOutput, type Factor } from "../doe";
import { formatNumber } from "../doe/format";
import { parseOrThrow } from "../errors/app-error";
import type { ModelSpec } from "../stats/model-terms";
import { ALTERNATIVE_LABELS, unitLabel } from "./safe-design-labels";

export { ALTERNATIVE_LABELS, QUICK_ALTERNATIVES, unitLabel } from "./safe-design-labels";

const modelSchema = z.union([z.enum(["linear", "interaction", "quadratic"]), z.array(text(200).min(1)).min(1).max(40)]);

/**
 * `POST /plans/alternatives`: the plan document as the editor holds it; optionally the
 * model the D-efficiencies are for and which alternatives to compute (default all).
 */
export const safeDesignRequestSchema = z.object({
  document: z.record(z.string(), z.unknown(), { message: "give the plan document as a JSON object" }),
  model: modelSchema.optional(),
  kinds: z.array(z.enum(ALTERNATIVE_KINDS)).min(1).max(ALTERNATIVE_KINDS.length).optional(),
});
export type SafeDesignRequest = z.input<typeof safeDesignRequestSchema>;

/** One finding at a run: a blocking caution of the hazard engine, or a physical limit the run leaves. */
export interface SafeDesignFinding extends SafetyFinding {
  severity: "blocking" | "limit";
}

/** A run of the plan's design that blocks, with what blocks it. */
export interface BlockingRun {
  /** The run's number on the run sheet (its standard order). */
  run: number;
  standardOrder: number;
  runOrder: number;
  kind: string;
  natural: Record<string, number>;
  findings: SafeDesignFinding[];
}

/** One alternative, side by side with the others. */
export interface SafeDesignAlternative {
  kind: AlternativeKind;
  label: string;
  /** False when the alternative does not apply; `summary` says why. */
  available: boolean;
  summary: string;
  runCount: number | null;
  /** True when no run of the alternative trips a blocking caution or leaves a limit. */
  nothingBlocks: boolean | null;
  /** Standard orders of the alternative's runs that still block. */
  stillBlocking: number[];
  /** D-efficiency relative to the plan's design for `model` (1 = as informative), or null. */
  dEfficiency: number | null;
  /** What applying it changes, in words ("α 1.682 → 1.167", "temperature 70–110 → 70–98 °C"). */
  changes: string[];
  /** The document with the alternative applied (what the chemist sent, with `design` and any changed factor replaced), or null. */
  document: Record<string, unknown> | null;
}

export interface SafeDesignReport {
  /** The model the D-efficiencies are for (term names as in `fit`), or null when no alternatives were computed. */
  model: ModelSpec | null;
  /** Runs of the plan's design. */
  runCount: number;
  blockingRuns: BlockingRun[];
  alternatives: SafeDesignAlternative[];
  /** Alternatives this answer leaves out because they were not asked for. */
  notComputed: AlternativeKind[];
  /** Why no alternatives are offered (nothing blocks; the design is a list of runs), or null. */
  note: string | null;
}

/** The findings at a point that make it blocked: every blocking caution and every limit left. */
function findingsOf(r: PointSafetyResult): SafeDesignFinding[] {
  return [...r.blocking.map((f) => ({ ...f, severity: "blocking" as const })), ...r.limits.map((f) => ({ ...f, severity: "limit" as const }))];
}

const DESIGN_LABELS: Record<string, string> = {
  "full-factorial": "full factorial",
  "fractional-factorial": "fractional factorial",
  "central-composite": "central composite",
  "box-behnken": "Box–Behnken",
  "d-optimal": "D-optimal",
};

/** A factor limit as typed or as the engine rounded it (to 1/1000 of the range): up to 6 significant digits. */
const limit = (v: number) => String(Number(v.toPrecision(6))).replace("-", "−");
const range = (f: Factor) => `${limit(f.low)}–${limit(f.high)}`;

/** What an alternative changes against the plan's design, in words. */
function changesOf(original: { input: Record<string, unknown>; design: DesignOutput; factors: readonly Factor[] }, alt: Extract<DesignAlternative, { available: true }>): string[] {
  const out: string[] = [];
  const a = alt.input as Record<string, unknown>;
  const from = String(original.input.design ?? "");
  const to = String(a.design ?? "");
  if (from !== to) out.push(`${DESIGN_LABELS[from] ?? from} → ${DESIGN_LABELS[to] ?? to} design`);
  else if (to === "central-composite") {
    const a0 = original.design.alpha;
    const a1 = alt.design.alpha;
    if (a0 !== null && a0 !== undefined && a1 !== null && a1 !== undefined && formatNumber(a0) !== formatNumber(a1)) out.push(`α ${formatNumber(a0)} → ${formatNumber(a1)}`);
    const p0 = String(original.input.placement ?? "circumscribed");
    const p1 = String(a.placement ?? "circumscribed");
    if (p0 !== p1) out.push(`${p0} → ${p1}: axial runs at the factor limits, factorial runs at ±${formatNumber(1 / (a1 ?? 1))} coded`);
  }
  for (const g of alt.changedFactors) {
    const f = original.factors.find((x) => x.name === g.name);
    if (!f) continue;
    const unit = unitLabel(f.unit);
    out.push(`${f.name} ${range(f)} → ${range(g)}${unit ? ` ${unit}` : ""}`);
  }
  if (alt.runCount !== original.design.runs.length) out.push(`${original.design.runs.length} → ${alt.runCount} runs`);
  return out;
}

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === "object" && !Array.isArray(v);

/** The document the chemist sent with an alternative's design input applied (module comment). */
function appliedDocument(sent: Record<string, unknown>, sentDesign: Record<string, unknown>, alt: Extract<DesignAlternative, { available: true }>, defaultHardToChange: unknown): Record<string, unknown> {
  const { factors: _factors, ...design } = alt.input as Record<string, unknown>;
  // The plan groups runs by its temperature factor unless told otherwise; keep that implicit.
  if (sentDesign.hardToChange === undefined && design.hardToChange === defaultHardToChange) delete design.hardToChange;
  const changed = new Map(alt.changedFactors.map((g) => [g.name, g]));
  const factors = Array.isArray(sent.factors)
    ? sent.factors.map((f: unknown) => {
        if (!isObject(f)) return f;
        const g = changed.get(String(f.name));
        return g ? { ...f, low: g.low, high: g.high } : f;
      })
    : sent.factors;
  return { ...sent, design, ...(factors === undefined ? {} : { factors }) };
}

function alternativeView(
  alt: DesignAlternative,
  original: { input: Record<string, unknown>; design: DesignOutput; factors: readonly Factor[] },
  apply: (alt: Extract<DesignAlternative, { available: true }>) => Record<string, unknown>,
): SafeDesignAlternative {
  const label = ALTERNATIVE_LABELS[alt.kind];
  if (!alt.available) {
    return { kind: alt.kind, label, available: false, summary: alt.summary, runCount: null, nothingBlocks: null, stillBlocking: [], dEfficiency: null, changes: [], document: null };
  }
  return {
    kind: alt.kind,
    label,
    available: true,
    summary: alt.summary,
    runCount: alt.runCount,
    nothingBlocks: alt.nothingBlocks,
    stillBlocking: alt.blockedRuns.map((r) => r.standardOrder),
    dEfficiency: alt.dEfficiency,
    changes: changesOf(original, alt),
    document: apply(alt),
  };
}

/**
 * The safe-design report of a plan document.
 *
 * - `sent`: the document as the chemist sent it (the applied alternatives start from it);
 * - `evaluated`: the same document as the engines judge it — in the stored form, with the
 *   lab's defaults and the inventory's hazard facts applied (lib/plans/server).
 *
 * With `kinds`, only those alternatives are computed (the rest are listed in
 * `notComputed`). When no run blocks, no alternatives are computed.
 * @throws AppError invalid_input at paths of the document (a document the engines refuse).
 */
export function safeDesign(
  docs: { sent: Record<string, unknown>; evaluated: PlanDocumentInput },
  options: { model?: ModelSpec; kinds?: readonly AlternativeKind[] } = {},
): SafeDesignReport {
  const doc: PlanDocument = parseOrThrow(planDocumentSchema, docs.evaluated, "The plan document is not valid.");
  const at = pointSafety(doc);
  const runs = resolveRuns(doc);
  const blockingRuns: BlockingRun[] = [];
  for (const r of runs) {
    const findings = findingsOf(at(r.natural));
    if (findings.length > 0) blockingRuns.push({ run: r.standardOrder, standardOrder: r.standardOrder, runOrder: r.runOrder, kind: r.kind, natural: r.natural, findings });
  }
  const kinds = options.kinds ?? ALTERNATIVE_KINDS;
  const base = { runCount: runs.length, blockingRuns };
  if (blockingRuns.length === 0) return { ...base, model: null, alternatives: [], notComputed: [], note: "No run of the design trips a blocking caution or leaves a limit." };
  if (Array.isArray(doc.design.runs)) {
    return { ...base, model: null, alternatives: [], notComputed: [], note: "The design is a list of runs: choose a design type to be offered alternatives, or edit the blocking runs." };
  }

  const input = planDesignInput(doc);
  // The verdict as codes (cheap); the messages are read only for the runs named above.
  const blocked = (natural: Record<string, number>): string | false => {
    const r = at(natural);
    if (r.blocking.length === 0 && r.limits.length === 0) return false;
    return [...r.blocking, ...r.limits].map((f) => f.code).join(", ");
  };
  const res = safeDesignAlternatives(input, blocked, { ...(options.model ? { model: options.model } : {}), kinds });
  const sentDesign = isObject(docs.sent.design) ? docs.sent.design : {};
  const original = { input: { ...res.original.input } as Record<string, unknown>, design: res.original.design, factors: input.factors };
  const apply = (alt: Extract<DesignAlternative, { available: true }>) => appliedDocument(docs.sent, sentDesign, alt, input.hardToChange);
  return {
    ...base,
    model: res.model,
    alternatives: res.alternatives.map((a) => alternativeView(a, original, apply)),
    notComputed: ALTERNATIVE_KINDS.filter((k) => !kinds.includes(k)),
    note: null,
  };
}
