/**
 * Student t and F distributions, through jstat (regularised incomplete beta function,
 * Numerical Recipes §6.4). Tail probabilities are computed from the incomplete beta
 * directly so that small p-values keep their digits.
 */
import jStat from "jstat";

function checkDf(df: number, name = "degrees of freedom"): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`${name} must be positive and finite (got ${df})`);
}

/**
 * The t quantile t_p(df), e.g. tQuantile(0.975, 10) ≈ 2.228. Throws RangeError for
 * p outside (0, 1) or df ≤ 0.
 */
export function tQuantile(p: number, df: number): number {
  checkDf(df);
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be in (0, 1) (got ${p})`);
  return jStat.studentt.inv(p, df);
}

/** Two-sided p-value of a t statistic: P(|T| ≥ |t|) = I_{df/(df+t²)}(df/2, 1/2). */
export function tTwoSidedP(t: number, df: number): number {
  checkDf(df);
  if (Number.isNaN(t)) return NaN;
  if (!Number.isFinite(t)) return 0;
  return jStat.ibeta(df / (df + t * t), df / 2, 0.5);
}

/** Upper-tail p-value of an F statistic: P(F ≥ f) = I_{d2/(d2+d1·f)}(d2/2, d1/2). */
export function fUpperP(f: number, df1: number, df2: number): number {
  checkDf(df1, "numerator degrees of freedom");
  checkDf(df2, "denominator degrees of freedom");
  if (Number.isNaN(f)) return NaN;
  if (f <= 0) return 1;
  if (!Number.isFinite(f)) return 0;
  return jStat.ibeta(df2 / (df2 + df1 * f), df2 / 2, df1 / 2);
}

/** The F quantile F_p(df1, df2), e.g. fQuantile(0.95, 3, 4) ≈ 6.591. */
export function fQuantile(p: number, df1: number, df2: number): number {
  checkDf(df1, "numerator degrees of freedom");
  checkDf(df2, "denominator degrees of freedom");
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be in (0, 1) (got ${p})`);
  return jStat.centralF.inv(p, df1, df2);
}
