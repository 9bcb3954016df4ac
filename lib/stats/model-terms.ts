/**
 * Polynomial model terms over coded factors (Myers, Montgomery & Anderson-Cook,
 * Response Surface Methodology, ch. 2): a term is a product of factors raised to
 * powers, named `intercept`, `a`, `a*b` (factors in the order of `factors`), `a^2`.
 */
import { z } from "zod";
import { AppError } from "../errors/app-error";

/** A term as exponents per factor (all zero for the intercept). */
export interface Term {
  name: string;
  exponents: number[];
}

/** The named model families, or an explicit list of term names. */
export const modelSpecSchema = z.union([
  z.enum(["linear", "interaction", "quadratic"]),
  z.array(z.string().min(1)).min(1, "list at least one term"),
]);
export type ModelSpec = z.output<typeof modelSpecSchema>;

/** The canonical name of a term from its exponents. */
export function termName(exponents: readonly number[], names: readonly string[]): string {
  const parts: string[] = [];
  exponents.forEach((e, i) => {
    if (e === 1) parts.push(names[i]!);
    else if (e > 1) parts.push(`${names[i]!}^${e}`);
  });
  return parts.length === 0 ? "intercept" : parts.join("*");
}

function term(exponents: number[], names: readonly string[]): Term {
  return { name: termName(exponents, names), exponents };
}

/**
 * Parses one term name ("temperature*time", "time^2", "intercept") into exponents.
 * Throws an invalid-input AppError at `path` for an unknown factor or bad syntax.
 */
export function parseTerm(text: string, names: readonly string[], path = "model"): Term {
  const t = text.trim();
  const k = names.length;
  if (t === "intercept" || t === "1") return term(new Array<number>(k).fill(0), names);
  const exps = new Array<number>(k).fill(0);
  for (const raw of t.split("*")) {
    const m = /^\s*([A-Za-z][A-Za-z0-9_]*)\s*(?:\^\s*(\d+))?\s*$/.exec(raw);
    if (!m) throw AppError.field(path, `"${text}" is not a term (write a, a*b or a^2)`);
    const i = names.indexOf(m[1]!);
    if (i < 0) throw AppError.field(path, `"${m[1]}" in "${text}" is not a factor`);
    const e = m[2] === undefined ? 1 : Number(m[2]);
    if (!(e >= 1 && e <= 6)) throw AppError.field(path, `power in "${text}" must be 1 to 6`);
    exps[i]! += e;
  }
  return term(exps, names);
}

/**
 * The terms of a model: `linear` (intercept and main effects), `interaction` (plus all
 * two-factor interactions), `quadratic` (plus the square of each factor: the full
 * second-order model with (k+1)(k+2)/2 terms), or the listed terms. The intercept is
 * always included and first; duplicates are removed; order: intercept, main effects,
 * two-factor interactions, squares, then any others in the order given.
 */
export function buildTerms(spec: ModelSpec, names: readonly string[], path = "model"): Term[] {
  const k = names.length;
  const unit = (i: number, e = 1) => {
    const x = new Array<number>(k).fill(0);
    x[i] = e;
    return x;
  };
  const out: Term[] = [term(new Array<number>(k).fill(0), names)];
  if (typeof spec === "string") {
    for (let i = 0; i < k; i++) out.push(term(unit(i), names));
    if (spec === "interaction" || spec === "quadratic") {
      for (let i = 0; i < k; i++)
        for (let j = i + 1; j < k; j++) {
          const x = new Array<number>(k).fill(0);
          x[i] = 1;
          x[j] = 1;
          out.push(term(x, names));
        }
    }
    if (spec === "quadratic") for (let i = 0; i < k; i++) out.push(term(unit(i, 2), names));
    return out;
  }
  const seen = new Set(["intercept"]);
  const parsed = spec.map((s, idx) => parseTerm(s, names, `${path}.${idx}`));
  const rank = (t: Term) => {
    const deg = t.exponents.reduce((a, b) => a + b, 0);
    const maxE = Math.max(...t.exponents);
    if (deg === 1) return 1;
    if (deg === 2 && maxE === 1) return 2;
    if (deg === 2 && maxE === 2) return 3;
    return 4;
  };
  const sorted = parsed
    .map((t, i) => ({ t, i }))
    .sort((a, b) => rank(a.t) - rank(b.t) || a.i - b.i)
    .map((x) => x.t);
  for (const t of sorted) {
    if (seen.has(t.name)) continue;
    seen.add(t.name);
    out.push(t);
  }
  return out;
}

/** The value of a term at a coded point. */
export function termValue(t: Term, x: ArrayLike<number>): number {
  let v = 1;
  const e = t.exponents;
  for (let i = 0; i < e.length; i++) {
    const p = e[i]!;
    if (p === 0) continue;
    const xi = x[i]!;
    v *= p === 1 ? xi : p === 2 ? xi * xi : Math.pow(xi, p);
  }
  return v;
}

/** The model-matrix row f(x) for the terms at coded point x. */
export function modelRow(terms: readonly Term[], x: ArrayLike<number>, out?: Float64Array): Float64Array {
  const row = out ?? new Float64Array(terms.length);
  for (let j = 0; j < terms.length; j++) row[j] = termValue(terms[j]!, x);
  return row;
}

/** True when `outer` contains `inner` (every exponent at least as large, and they differ). */
export function termContains(outer: Term, inner: Term): boolean {
  let differs = false;
  for (let i = 0; i < outer.exponents.length; i++) {
    if (outer.exponents[i]! < inner.exponents[i]!) return false;
    if (outer.exponents[i] !== inner.exponents[i]) differs = true;
  }
  return differs;
}

/** True for a pure square term (one factor, power 2). */
export function isSquareTerm(t: Term): boolean {
  return t.exponents.filter((e) => e > 0).length === 1 && t.exponents.some((e) => e === 2);
}

/** Total degree of a term. */
export function termDegree(t: Term): number {
  return t.exponents.reduce((a, b) => a + b, 0);
}
