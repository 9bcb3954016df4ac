/**
 * Backward elimination of model terms at level α (Montgomery, Design and Analysis of
 * Experiments, §10.3 on selecting the model), keeping the model hierarchical — a main
 * effect stays while an interaction or square containing it stays (Montgomery, Peck &
 * Vining, Introduction to Linear Regression Analysis, §7.1 on polynomial models;
 * section from memory),
 * recording each step and why. One factorisation of the full model; each removal
 * updates its p×p triangle as columns leave (lib/stats/qr-update.ts), so no step refits the n rows.
 */
import { tTwoSidedP } from "./distributions";
import type { LeastSquaresFit } from "./least-squares";
import { termContains, type Term } from "./model-terms";
import { ShrinkingQr } from "./qr-update";

/** p-values closer than this count as tied. */
export const P_TIE_TOLERANCE = 1e-9;

/** One column of the fit as elimination sees it. */
export interface PrunableColumn {
  name: string;
  /** The model term, or null for a column that is not a term of the surface (a block column). */
  term: Term | null;
  /** Never removed (the intercept, block columns). */
  fixed: boolean;
}

/** A term above α that stayed at a step because a term containing it is in the model. */
export interface HeldTerm {
  term: string;
  p: number;
  heldBy: string[];
}

/** One step of backward elimination (CONTRACT.md `fit` output, field `pruning.steps`). */
export interface EliminationStep {
  /** 1-based. */
  step: number;
  /** The term that left at this step; null on the last step, when none left. */
  removed: string | null;
  /** Its p-value in the model of this step (null on the last step). */
  p: number | null;
  /** Why, in words. */
  reason: string;
  /** Terms above α kept at this step because a higher-order term containing them is in the model. */
  heldByHierarchy: HeldTerm[];
  /** Terms whose p tied with the removed term's (within 1e-9) and stayed by the tie rule. */
  tiedWith: string[];
  /** Residual degrees of freedom and RMSE of the model this step looked at. */
  dfResidual: number;
  /** Null when there are no residual degrees of freedom. */
  rmse: number | null;
}

export interface EliminationResult {
  /** Positions (into the columns given) that stay, in order. */
  kept: number[];
  /** Positions removed, in the order removed. */
  dropped: number[];
  steps: EliminationStep[];
}

const fmtP = (p: number) => (p < 1e-4 ? p.toExponential(2) : p.toPrecision(3));

/**
 * Backward elimination at level α from a full fit: at each step the term with the
 * largest p-value above α leaves; with `hierarchy`, a term stays while a higher-order
 * term containing it (a*b or a^2 for a) is in the model; fixed columns never leave.
 * Ties: p-values within P_TIE_TOLERANCE (1e-9) of the largest count as equal, and of
 * those the term latest in model order (the order of `columns`) leaves first — the
 * choice never rests on the last digit of rounding. Stops when no term may leave or no
 * residual degree of freedom is left. `columns` describe the fit's kept columns in order.
 * Example: backwardEliminate(fit, cols, { alpha: 0.05, hierarchy: true }).steps[0].removed
 */
export function backwardEliminate(full: LeastSquaresFit, columns: readonly PrunableColumn[], options: { alpha: number; hierarchy: boolean }): EliminationResult {
  if (columns.length !== full.kept.length) throw new RangeError("one column description per fitted column is needed");
  const { alpha, hierarchy } = options;
  const n = full.fitted.length;
  const qr = new ShrinkingQr(full);
  const dropped: number[] = [];
  const steps: EliminationStep[] = [];
  for (;;) {
    const active = qr.columns;
    const df = n - active.length;
    const step = steps.length + 1;
    if (df <= 0) {
      steps.push({ step, removed: null, p: null, reason: "No residual degrees of freedom: p-values cannot be computed, so nothing more is removed.", heldByHierarchy: [], tiedWith: [], dfResidual: df, rmse: null });
      break;
    }
    const { coefficients, covDiagonal } = qr.solve();
    const s2 = qr.rss / df;
    const pOf = (a: number) => {
      const se = Math.sqrt(s2 * covDiagonal[a]!);
      return se > 0 ? tTwoSidedP(coefficients[a]! / se, df) : 0;
    };
    const candidates: { a: number; p: number }[] = [];
    const held: HeldTerm[] = [];
    active.forEach((c, a) => {
      const col = columns[c]!;
      if (col.fixed || col.term === null) return;
      const p = pOf(a);
      if (!(p > alpha)) return;
      const t = col.term;
      const holders = hierarchy ? active.filter((o) => o !== c && columns[o]!.term !== null && termContains(columns[o]!.term!, t)).map((o) => columns[o]!.name) : [];
      if (holders.length) held.push({ term: col.name, p, heldBy: holders });
      else candidates.push({ a, p });
    });
    const rmse = Math.sqrt(s2);
    if (candidates.length === 0) {
      const reason = held.length
        ? `Every term that may leave has p ≤ α = ${alpha}; ${held.map((h) => `${h.term} (p = ${fmtP(h.p)})`).join(", ")} stay${held.length === 1 ? "s" : ""} for hierarchy.`
        : `Every remaining term has p ≤ α = ${alpha}.`;
      steps.push({ step, removed: null, p: null, reason, heldByHierarchy: held, tiedWith: [], dfResidual: df, rmse });
      break;
    }
    const maxP = Math.max(...candidates.map((c) => c.p));
    const tied = candidates.filter((c) => c.p >= maxP - P_TIE_TOLERANCE);
    const worst = tied.reduce((w, c) => (active[c.a]! > active[w.a]! ? c : w));
    const name = columns[active[worst.a]!]!.name;
    const others = tied.filter((c) => c !== worst).map((c) => columns[active[c.a]!]!.name);
    let reason = `${name} has the largest p-value (${fmtP(worst.p)}) above α = ${alpha} among the terms that may leave.`;
    if (others.length) reason += ` It ties with ${others.join(", ")} (p within ${P_TIE_TOLERANCE}); the term later in model order leaves first.`;
    steps.push({ step, removed: name, p: worst.p, reason, heldByHierarchy: held, tiedWith: others, dfResidual: df, rmse });
    dropped.push(active[worst.a]!);
    qr.remove(worst.a);
  }
  return { kept: [...qr.columns], dropped, steps };
}
