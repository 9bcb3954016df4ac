/**
 * The `d-optimal` design of the `design` verb: the candidate set (a given list, or the
 * default grid), less the points the constraints, the input's `excludeCandidates` and
 * the caller's filter remove, then the exchange search of `d-optimal.ts`. The bounds of
 * `D_OPTIMAL_LIMITS` are checked here, before any large array is built, and a refusal
 * names the field to change.
 */
import { AppError } from "../errors/app-error";
import { buildTerms, isSquareTerm } from "../stats/model-terms";
import { parseConstraints, satisfiesAll } from "./constraints";
import type { DesignInput } from "./design-schema";
import { D_OPTIMAL_LIMITS, candidateMatrix, dOptimalWorkCheck, fedorovExchange, gridCandidateCount, gridCandidates } from "./d-optimal";
import { codeValue, decodeValue } from "./factors";
import { naturalRecord, type SafetyVerdict } from "./safe-envelope";

/**
 * A caller's verdict on a point in natural units: false (or a `SafetyVerdict` with no
 * blocking caution) keeps it; true, a reason (a non-empty string) or a `SafetyVerdict`
 * with blocking cautions removes it. The hazard engine's point safety (a `SafetyCheck`
 * of safe-envelope.ts) is one, so that no candidate a blocking caution would hit is
 * ever used.
 */
export type PointVerdict = (natural: Record<string, number>) => boolean | string | SafetyVerdict;

/** Why a verdict removes the point (the cautions' messages, the reason given, or "blocked"), or null when it keeps it. */
export function removalReason(verdict: boolean | string | SafetyVerdict): string | null {
  if (typeof verdict === "object") return verdict.blocking.length > 0 ? verdict.blocking.map((c) => c.message).join("; ") : null;
  if (typeof verdict === "string") return verdict.length > 0 ? verdict : null;
  return verdict ? "blocked" : null;
}

/** True when a verdict removes the point. */
export function isRemoved(verdict: boolean | string | SafetyVerdict): boolean {
  return removalReason(verdict) !== null;
}

/** Summary of a D-optimal search (the `dOptimal` field of the design output). */
export interface DOptimalSummary {
  /** The model terms, in order. */
  model: string[];
  /** ln det(X'X) in coded units. */
  logDet: number;
  /** 100·det(X'X)^(1/p)/n, in %. */
  dEfficiency: number;
  /** Candidate points the search could use. */
  candidates: number;
  /** Candidate points removed (constraints, `excludeCandidates` and the caller's filter). */
  candidatesRemoved: number;
  /** Of those, removed by `excludeCandidates` or the caller's filter. */
  candidatesExcluded: number;
  /** Seeded starts the search ran. */
  starts: number;
  /** True when the work budget ended the search before all starts ran. */
  stoppedByBudget: boolean;
}

/** Options of `dOptimalPoints` that a JSON input cannot carry. */
export interface DOptimalPointsOptions {
  /** Removes candidates (and refuses centre points) the caller's test blocks. */
  exclude?: PointVerdict;
}

/** A key of a coded point to 1e-7, for matching `excludeCandidates` against candidates. */
function pointKey(coded: readonly number[]): string {
  return coded.map((v) => Math.round(v * 1e7)).join(",");
}

/**
 * The runs of a d-optimal design, coded, with the search summary. `nCentre` centre
 * points are checked (not placed) here: they must satisfy the constraints and the
 * caller's filter. Throws an invalid-input AppError naming `model`, `factors`, `runs`,
 * `candidates.<i>.<factor>` or `centerPoints` for a request beyond the bounds or a
 * centre point that is not allowed, and an "infeasible" AppError when too few
 * candidates are left for the model.
 */
export function dOptimalPoints(input: DesignInput, nCentre: number, options: DOptimalPointsOptions = {}): { coded: number[][]; summary: DOptimalSummary } {
  const factors = input.factors;
  const k = factors.length;
  const names = factors.map((f) => f.name);
  const terms = buildTerms(input.model, names);
  const p = terms.length;
  const n = input.runs!;
  if (p > D_OPTIMAL_LIMITS.terms) {
    // A named model grows with the factors; a list of terms is what the caller typed.
    if (typeof input.model === "string") {
      throw AppError.field(
        "factors",
        `${k} factors give a ${input.model} model of ${p} terms (at most ${D_OPTIMAL_LIMITS.terms}); use fewer factors or a smaller model`,
      );
    }
    throw AppError.field("model", `has ${p} terms (at most ${D_OPTIMAL_LIMITS.terms}); list fewer terms`);
  }
  const constraints = parseConstraints(input.constraints, factors);
  const exclude = options.exclude;
  const blockedBy = (coded: readonly number[]): string | null => (exclude ? removalReason(exclude(naturalRecord(factors, coded))) : null);

  if (nCentre > 0) {
    const centre = new Array<number>(k).fill(0);
    if (!satisfiesAll(constraints, factors.map((f) => decodeValue(f, 0)))) throw AppError.field("centerPoints", "the centre point violates the constraints");
    const why = blockedBy(centre);
    if (why) throw AppError.field("centerPoints", `the centre point is excluded (${why})`);
  }

  let coded: number[][];
  if (input.candidates) {
    coded = input.candidates.map((c, i) =>
      factors.map((f) => {
        const v = c[f.name]!;
        if (f.scale === "log" && !(v > 0)) throw AppError.field(`candidates.${i}.${f.name}`, "must be positive for a log-scale factor");
        return codeValue(f, v);
      }),
    );
  } else {
    const levels = input.levels ?? (terms.some((t) => isSquareTerm(t) || t.exponents.some((e) => e >= 2)) ? 3 : 2);
    const count = gridCandidateCount(k, levels);
    if (count > D_OPTIMAL_LIMITS.candidates) {
      let most = k;
      while (most > 1 && gridCandidateCount(most, levels) > D_OPTIMAL_LIMITS.candidates) most--;
      throw AppError.field(
        "factors",
        `${k} factors give a default candidate set of ${count} points (at most ${D_OPTIMAL_LIMITS.candidates}); use at most ${most} factors or give the candidates`,
      );
    }
    coded = gridCandidates(k, levels);
  }
  const total = coded.length;

  const excludedKeys = new Set<string>();
  input.excludeCandidates?.forEach((c, i) => {
    excludedKeys.add(
      pointKey(
        factors.map((f) => {
          const v = c[f.name]!;
          if (f.scale === "log" && !(v > 0)) throw AppError.field(`excludeCandidates.${i}.${f.name}`, "must be positive for a log-scale factor");
          return codeValue(f, v);
        }),
      ),
    );
  });
  let byList = 0;
  let byFilter = 0;
  const kept = coded.filter((x) => {
    if (!satisfiesAll(constraints, x.map((v, i) => decodeValue(factors[i]!, v)))) return false;
    if (excludedKeys.size > 0 && excludedKeys.has(pointKey(x))) {
      byList++;
      return false;
    }
    if (blockedBy(x)) {
      byFilter++;
      return false;
    }
    return true;
  });
  if (kept.length === 0) {
    // Name what removed the last points: the caller's filter (then the factor ranges are
    // what to change), the exclusion list, or the constraints.
    const path = byFilter > 0 ? "factors" : byList > 0 ? "excludeCandidates" : "constraints";
    throw new AppError("infeasible", "No candidate point is left.", [{ path, message: "removes every candidate point" }]);
  }
  if (n >= p) {
    const why = dOptimalWorkCheck(kept.length, p, n);
    if (why) throw AppError.field("runs", why);
  }
  const F = candidateMatrix(terms, kept);
  const res = fedorovExchange(F, p, { runs: n, seed: input.seed ?? 1, starts: input.starts, tabuSteps: input.tabuSteps });
  return {
    coded: res.indices.map((i) => [...kept[i]!]),
    summary: {
      model: terms.map((t) => t.name),
      logDet: res.logDet,
      dEfficiency: res.dEfficiency,
      candidates: kept.length,
      candidatesRemoved: total - kept.length,
      candidatesExcluded: byList + byFilter,
      starts: res.starts,
      stoppedByBudget: res.stoppedByBudget,
    },
  };
}
