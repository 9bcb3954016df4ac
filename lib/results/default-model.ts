/**
 * The model an analysis page opens with, from the design's coded runs (common practice: a
 * two-level screen is read for main effects and interactions, a response-surface design
 * for curvature): quadratic when some run is neither a corner of the cube nor the centre
 * (axial runs, Box–Behnken edge midpoints, optimal designs) and there are more runs than
 * quadratic terms; else two-factor interactions when there are more runs than those
 * terms; else linear. The chemist can change it at once.
 * Example: defaultModel([[-1,-1],[1,-1],[-1,1],[1,1],[0,0],[0,0]]) === "interaction"
 */
export function defaultModel(coded: readonly (readonly number[])[]): "linear" | "interaction" | "quadratic" {
  const n = coded.length;
  const k = coded[0]?.length ?? 0;
  const corner = (x: readonly number[]) => x.every((v) => Math.abs(Math.abs(v) - 1) < 1e-9);
  const centre = (x: readonly number[]) => x.every((v) => Math.abs(v) < 1e-9);
  const surface = coded.some((x) => !corner(x) && !centre(x));
  if (surface && n > ((k + 1) * (k + 2)) / 2) return "quadratic";
  if (n > 1 + k + (k * (k - 1)) / 2) return "interaction";
  return "linear";
}
