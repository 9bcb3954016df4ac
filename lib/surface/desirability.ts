/**
 * Derringer–Suich desirability (Derringer & Suich, "Simultaneous optimization of
 * several response variables", Journal of Quality Technology 12, 1980): each response
 * ŷ maps to d ∈ [0, 1], and the overall desirability is the weighted geometric mean
 * D = (Π dᵢ^wᵢ)^(1/Σwᵢ).
 */
import { z } from "zod";

/** How one response is valued. `shape` is the exponent s (or s, t for a target). */
export const desirabilitySpecSchema = z
  .object({
    name: z.string().min(1),
    goal: z.enum(["maximize", "minimize", "target"]),
    low: z.number().finite(),
    high: z.number().finite(),
    target: z.number().finite().optional(),
    /** Exponent s (maximize/minimize, and the low side of a target). */
    shape: z.number().positive().finite().default(1),
    /** Exponent t for the high side of a target. */
    shapeHigh: z.number().positive().finite().default(1),
    /** Importance weight wᵢ in the geometric mean. */
    weight: z.number().positive().finite().default(1),
  })
  .superRefine((s, ctx) => {
    if (!(s.low < s.high)) ctx.addIssue({ code: "custom", path: ["high"], message: "must be greater than low" });
    if (s.goal === "target") {
      if (s.target === undefined) ctx.addIssue({ code: "custom", path: ["target"], message: "is required for goal target" });
      else if (!(s.target > s.low && s.target < s.high)) ctx.addIssue({ code: "custom", path: ["target"], message: "must lie strictly between low and high" });
    }
  });

export type DesirabilitySpec = z.output<typeof desirabilitySpecSchema>;

/**
 * The individual desirability of a predicted value (Derringer & Suich 1980):
 * maximize d = ((y − L)/(H − L))^s clipped to [0, 1]; minimize d = ((H − y)/(H − L))^s;
 * target T: ((y − L)/(T − L))^s below T, ((H − y)/(H − T))^t above, 0 outside [L, H].
 * Example: desirability({goal:"maximize", low:60, high:90, shape:1, ...}, 75) === 0.5
 */
export function desirability(spec: DesirabilitySpec, y: number): number {
  const { low: L, high: H } = spec;
  if (spec.goal === "maximize") {
    if (y <= L) return 0;
    if (y >= H) return 1;
    return Math.pow((y - L) / (H - L), spec.shape);
  }
  if (spec.goal === "minimize") {
    if (y >= H) return 0;
    if (y <= L) return 1;
    return Math.pow((H - y) / (H - L), spec.shape);
  }
  const T = spec.target!;
  if (y <= L || y >= H) return 0;
  if (y <= T) return Math.pow((y - L) / (T - L), spec.shape);
  return Math.pow((H - y) / (H - T), spec.shapeHigh);
}

/**
 * The overall desirability D = (Π dᵢ^wᵢ)^(1/Σwᵢ) of several predicted values (in the
 * order of `specs`). Zero when any dᵢ is zero. Throws RangeError on a length mismatch.
 */
export function overallDesirability(specs: readonly DesirabilitySpec[], values: readonly number[]): number {
  if (specs.length !== values.length) throw new RangeError("one value per response is needed");
  let logSum = 0;
  let wSum = 0;
  for (let i = 0; i < specs.length; i++) {
    const d = desirability(specs[i]!, values[i]!);
    if (d <= 0) return 0;
    logSum += specs[i]!.weight * Math.log(d);
    wSum += specs[i]!.weight;
  }
  return Math.exp(logSum / wSum);
}
