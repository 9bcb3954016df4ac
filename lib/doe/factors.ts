/**
 * Factors and their coding (the usual coding of response-surface methodology): a factor's natural value u is
 * coded as x = (u − u0) / Δu with u0 = (high + low)/2 and Δu = (high − low)/2, so the
 * low level is −1 and the high level +1 (Montgomery, Design and Analysis of
 * Experiments, §6.2). A log-scale factor is coded the same way on ln u, which suits
 * time or catalyst loading that are varied over a ratio rather than a difference.
 */
import { z } from "zod";
import { AppError } from "../errors/app-error";

/** A factor name must be usable inside a term name (`a*b`, `a^2`) and a constraint. */
export const FACTOR_NAME_PATTERN = /^[A-Za-z][A-Za-z0-9_]*$/;

/** Names that would collide with term names or constraint syntax. */
const RESERVED_NAMES = new Set(["intercept"]);

/** One factor: a name, its low and high natural values, an optional unit and scale. */
export const factorSchema = z
  .object({
    name: z
      .string()
      .regex(FACTOR_NAME_PATTERN, "must start with a letter and contain only letters, digits and _")
      .refine((n) => !RESERVED_NAMES.has(n.toLowerCase()), "is a reserved word"),
    low: z.number().finite(),
    high: z.number().finite(),
    unit: z.string().optional(),
    scale: z.enum(["linear", "log"]).default("linear"),
  })
  .superRefine((f, ctx) => {
    if (!(f.low < f.high)) ctx.addIssue({ code: "custom", path: ["high"], message: "must be greater than low" });
    if (f.scale === "log" && !(f.low > 0)) {
      ctx.addIssue({ code: "custom", path: ["low"], message: "must be positive for a log-scale factor" });
    }
  });

export type Factor = z.output<typeof factorSchema>;
/** A factor as a caller may write it (scale optional). */
export type FactorInput = z.input<typeof factorSchema>;

/**
 * A list of factors: at least one, names unique (case-sensitive, as term names are).
 * Issues point at `<index>.name` so a caller's path prefix gives `factors.1.name`.
 */
export const factorListSchema = z
  .array(factorSchema)
  .min(1, "at least one factor is needed")
  .superRefine((list, ctx) => {
    const seen = new Map<string, number>();
    list.forEach((f, i) => {
      if (seen.has(f.name)) {
        ctx.addIssue({ code: "custom", path: [i, "name"], message: `duplicates the name of factor ${seen.get(f.name)}` });
      } else seen.set(f.name, i);
    });
  });

function centreAndHalfRange(factor: Factor): [number, number] {
  if (factor.scale === "log") {
    const l = Math.log(factor.low);
    const h = Math.log(factor.high);
    return [(h + l) / 2, (h - l) / 2];
  }
  return [(factor.high + factor.low) / 2, (factor.high - factor.low) / 2];
}

/**
 * Codes a natural value: x = (u − u0)/Δu (on ln u for a log-scale factor).
 * Throws an invalid-input AppError for a non-positive value of a log-scale factor.
 * Example: codeValue({name:"T", low:70, high:110, scale:"linear"}, 100) === 0.5
 */
export function codeValue(factor: FactorInput | Factor, natural: number): number {
  const f = normaliseFactor(factor);
  const [u0, du] = centreAndHalfRange(f);
  if (f.scale === "log") {
    if (!(natural > 0)) throw AppError.field(f.name, "a log-scale factor needs a positive value");
    return (Math.log(natural) - u0) / du;
  }
  return (natural - u0) / du;
}

/**
 * Decodes a coded value: u = u0 + x·Δu (u = exp(u0 + x·Δu) for a log-scale factor).
 * Example: decodeValue({name:"T", low:70, high:110, scale:"linear"}, -1) === 70
 */
export function decodeValue(factor: FactorInput | Factor, coded: number): number {
  const f = normaliseFactor(factor);
  const [u0, du] = centreAndHalfRange(f);
  if (f.scale === "log") return Math.exp(u0 + coded * du);
  return u0 + coded * du;
}

function normaliseFactor(factor: FactorInput | Factor): Factor {
  return { ...factor, scale: factor.scale ?? "linear" };
}

/** Codes a whole point given as `{ name: natural }`; every factor must be present. */
export function codePoint(factors: readonly Factor[], natural: Record<string, number>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const f of factors) {
    const v = natural[f.name];
    if (v === undefined) throw AppError.field(f.name, "missing value");
    out[f.name] = codeValue(f, v);
  }
  return out;
}

/** Decodes a whole point given as `{ name: coded }`. */
export function decodePoint(factors: readonly Factor[], coded: Record<string, number>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const f of factors) {
    const v = coded[f.name];
    if (v === undefined) throw AppError.field(f.name, "missing value");
    out[f.name] = decodeValue(f, v);
  }
  return out;
}

/**
 * The conventional letters of factors in a two-level design: A, B, C, … in factor
 * order, skipping I (which stands for the identity in defining relations), as in
 * Montgomery's tables: the 9th factor is J, the 10th K.
 */
export const FACTOR_LETTERS = "ABCDEFGHJKLMNOPQRSTUVWXYZ";

/** The letter of the factor at `index` (0-based). */
export function factorLetter(index: number): string {
  const l = FACTOR_LETTERS[index];
  if (l === undefined) throw new AppError("invalid_input", "At most 25 factors have letters.", [{ path: "factors", message: "too many factors" }]);
  return l;
}
