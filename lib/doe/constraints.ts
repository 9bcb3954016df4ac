/**
 * Linear constraints on natural factor values, written as text such as
 * "temperature + 20*time <= 400" (the `design` verb's `constraints`). Parsed by a small
 * recursive-descent parser into Σ aᵢ·uᵢ ≤ b; a constraint that is not linear is an
 * input error.
 */
import { z } from "zod";
import { AppError } from "../errors/app-error";
import type { Factor } from "./factors";

/** One constraint as written in the input: `{ "expr": "temperature + 20*time <= 400" }`. */
export const constraintSchema = z.object({ expr: z.string().min(1).max(500) });
export type ConstraintInput = z.output<typeof constraintSchema>;

/** Σ coefficients[i]·u_i ≤ bound, in natural units. */
export interface LinearConstraint {
  expr: string;
  coefficients: number[];
  bound: number;
}

interface Lin {
  c: number[];
  k: number;
}

type Tok = { t: "num"; v: number } | { t: "id"; v: string } | { t: "op"; v: string };

function tokenize(src: string, path: string): Tok[] {
  const out: Tok[] = [];
  const re = /\s*(?:(\d+(?:\.\d*)?(?:[eE][+-]?\d+)?|\.\d+(?:[eE][+-]?\d+)?)|([A-Za-z][A-Za-z0-9_]*)|(<=|>=|≤|≥|<|>|[-+*/()]))/y;
  let pos = 0;
  while (pos < src.length) {
    if (/^\s*$/.test(src.slice(pos))) break;
    re.lastIndex = pos;
    const m = re.exec(src);
    if (!m) throw AppError.field(path, `cannot read "${src.slice(pos).trim()}"`);
    if (m[1] !== undefined) out.push({ t: "num", v: Number(m[1]) });
    else if (m[2] !== undefined) out.push({ t: "id", v: m[2] });
    else out.push({ t: "op", v: m[3]! });
    pos = re.lastIndex;
  }
  return out;
}

/**
 * Parses a constraint over the factors' natural values into Σ aᵢuᵢ ≤ b (a "≥"
 * constraint is negated). Throws an invalid-input AppError at `path` for bad syntax,
 * an unknown name, a product of two factors, or a constraint with no factor.
 * Example: parseConstraint("temperature + 20*time <= 400", factors)
 */
export function parseConstraint(expr: string, factors: readonly Factor[], path = "constraints.0.expr"): LinearConstraint {
  const names = factors.map((f) => f.name);
  const k = names.length;
  const toks = tokenize(expr, path);
  let i = 0;
  const zero = (): Lin => ({ c: new Array<number>(k).fill(0), k: 0 });
  const isConst = (a: Lin) => a.c.every((v) => v === 0);
  const scale = (a: Lin, s: number): Lin => ({ c: a.c.map((v) => v * s), k: a.k * s });
  const add = (a: Lin, b: Lin, s: number): Lin => ({ c: a.c.map((v, j) => v + s * b.c[j]!), k: a.k + s * b.k });
  const peek = () => toks[i];
  const fail = (msg: string): never => {
    throw AppError.field(path, msg);
  };
  const primary = (): Lin => {
    const tok = toks[i++];
    if (!tok) return fail("ends too early");
    if (tok.t === "num") return { ...zero(), k: tok.v };
    if (tok.t === "id") {
      const j = names.indexOf(tok.v);
      if (j < 0) return fail(`"${tok.v}" is not a factor`);
      const z0 = zero();
      z0.c[j] = 1;
      return z0;
    }
    if (tok.v === "-") return scale(primary(), -1);
    if (tok.v === "+") return primary();
    if (tok.v === "(") {
      const e = sum();
      const close = toks[i++];
      if (!close || close.t !== "op" || close.v !== ")") fail('missing ")"');
      return e;
    }
    return fail(`unexpected "${tok.v}"`);
  };
  const product = (): Lin => {
    let a = primary();
    for (let p = peek(); p && p.t === "op" && (p.v === "*" || p.v === "/"); p = peek()) {
      i++;
      const b = primary();
      if (p.v === "*") {
        if (isConst(a)) a = scale(b, a.k);
        else if (isConst(b)) a = scale(a, b.k);
        else fail("is not linear (a product of two factors)");
      } else {
        if (!isConst(b)) fail("is not linear (division by a factor)");
        if (b.k === 0) fail("divides by zero");
        a = scale(a, 1 / b.k);
      }
    }
    return a;
  };
  const sum = (): Lin => {
    let a = product();
    for (let p = peek(); p && p.t === "op" && (p.v === "+" || p.v === "-"); p = peek()) {
      i++;
      a = add(a, product(), p.v === "+" ? 1 : -1);
    }
    return a;
  };
  const left = sum();
  const op = toks[i++];
  if (!op || op.t !== "op" || !["<=", ">=", "<", ">", "≤", "≥"].includes(op.v)) {
    return fail('needs a comparison "<=" or ">="');
  }
  const right = sum();
  if (i !== toks.length) fail("has extra text after the right-hand side");
  const le = op.v === "<=" || op.v === "<" || op.v === "≤";
  const diff = le ? add(left, right, -1) : add(right, left, -1); // diff ≤ 0
  if (isConst(diff)) fail("involves no factor");
  if (diff.c.some((v) => !Number.isFinite(v)) || !Number.isFinite(diff.k)) fail("has a non-finite coefficient");
  return { expr, coefficients: diff.c, bound: -diff.k };
}

/** Parses a list of `{ expr }` constraints; issues name `constraints.<i>.expr`. */
export function parseConstraints(list: readonly ConstraintInput[] | undefined, factors: readonly Factor[], pathPrefix = "constraints"): LinearConstraint[] {
  return (list ?? []).map((c, i) => parseConstraint(c.expr, factors, `${pathPrefix}.${i}.expr`));
}

/** True when the natural point (in factor order) satisfies the constraint, to a relative 1e-9. */
export function satisfiesConstraint(c: LinearConstraint, natural: ArrayLike<number>): boolean {
  let s = 0;
  let scaleSum = Math.abs(c.bound);
  for (let i = 0; i < c.coefficients.length; i++) {
    const t = c.coefficients[i]! * natural[i]!;
    s += t;
    scaleSum += Math.abs(t);
  }
  return s <= c.bound + 1e-9 * (1 + scaleSum);
}

/** True when every constraint holds at the natural point. */
export function satisfiesAll(cs: readonly LinearConstraint[], natural: ArrayLike<number>): boolean {
  return cs.every((c) => satisfiesConstraint(c, natural));
}

/**
 * The constraint in coded units, Σ aᵢxᵢ ≤ b, when every factor it involves is on a
 * linear scale; null when it involves a log-scale factor (then it is not linear in x).
 */
export function constraintInCoded(c: LinearConstraint, factors: readonly Factor[]): { a: number[]; b: number } | null {
  const a: number[] = [];
  let b = c.bound;
  for (let i = 0; i < factors.length; i++) {
    const f = factors[i]!;
    const ci = c.coefficients[i]!;
    if (ci !== 0 && f.scale === "log") return null;
    const u0 = (f.high + f.low) / 2;
    const du = (f.high - f.low) / 2;
    a.push(ci * du);
    b -= ci * u0;
  }
  return { a, b };
}
