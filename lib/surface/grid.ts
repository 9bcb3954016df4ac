/**
 * A response surface on a grid, for contour and 3-D surface plots (Myers, Montgomery &
 * Anderson-Cook, Response Surface Methodology, ch. 6, contour plots of the fitted
 * surface): the fitted model evaluated over two factors in natural units, the others
 * held at natural values the caller sets. The axes may run past the studied range; each
 * point says whether it is an extrapolation (lib/surface/studied-region.ts), and, with
 * a safety check, which blocking cautions fire there so the caller can hatch and label
 * the unsafe regions.
 */
import { AppError } from "../errors/app-error";
import { codeValue, decodeValue, type Factor } from "../doe/factors";
import type { SafetyCheck } from "../doe/safe-envelope";
import type { FittedModel } from "../stats/fitted-model";
import { predictModelScale } from "../stats/predict";
import { outsideStudied, studiedRanges } from "./studied-region";

export interface SurfaceGridOptions {
  xFactor: string;
  yFactor: string;
  /** Points per axis (default 41, 2…401). */
  steps?: number;
  /** Natural range of each axis [from, to] (default: the studied range of that factor). */
  xRange?: [number, number];
  yRange?: [number, number];
  /** Natural values of the other factors (default: the centre of each). */
  fixed?: Record<string, number>;
  /** Called at every grid point with the natural values of all factors. */
  safety?: SafetyCheck;
}

/** A caution that blocks somewhere on the grid: its code, the first message seen, and how many points it covers. */
export interface GridCaution {
  code: string;
  message: string;
  points: number;
}

export interface SurfaceGrid {
  xFactor: string;
  yFactor: string;
  /** Coded and natural axis values (a log-scale factor is spaced evenly in its coded, logarithmic units). */
  xCoded: number[];
  yCoded: number[];
  xNatural: number[];
  yNatural: number[];
  /** Natural values at which the other factors are held. */
  fixed: Record<string, number>;
  /** The studied (natural) range of each axis, for shading what lies outside. */
  studied: { x: [number, number]; y: [number, number] };
  /** z[j][i]: predicted response (original scale) at (x_i, y_j), blocks averaged out. */
  z: number[][];
  /** extrapolated[j][i]: some factor at that point lies outside the range of the runs. */
  extrapolated: boolean[][];
  /** With a safety check: blocked[j][i] lists indices into `cautions` that block there (empty when safe); else null. */
  blocked: number[][][] | null;
  cautions: GridCaution[];
}

function axisRange(f: Factor, given: [number, number] | undefined, studied: { lo: number; hi: number }, path: string): [number, number] {
  if (!given) return [studied.lo, studied.hi];
  const [a, b] = given;
  if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b)) throw AppError.field(path, "give [from, to] with from < to");
  if (f.scale === "log" && !(a > 0)) throw AppError.field(`${path}.0`, "must be positive for a log-scale factor");
  return [codeValue(f, a), codeValue(f, b)];
}

/**
 * Evaluates the model on an even grid over two factors in natural units, marks the
 * extrapolated points and, given `safety`, the points where a blocking caution fires.
 * Throws an invalid-input AppError for an unknown or repeated factor name, a bad step
 * count, a bad range or a held value for an unknown factor.
 * Example: surfaceGrid(model, { xFactor: "temperature", yFactor: "time", xRange: [60, 140], steps: 101, safety })
 */
export function surfaceGrid(model: FittedModel, options: SurfaceGridOptions): SurfaceGrid {
  const factors = model.factors;
  const names = factors.map((f) => f.name);
  const ix = names.indexOf(options.xFactor);
  const iy = names.indexOf(options.yFactor);
  if (ix < 0) throw AppError.field("xFactor", "is not one of the factors");
  if (iy < 0) throw AppError.field("yFactor", "is not one of the factors");
  if (ix === iy) throw AppError.field("yFactor", "must differ from xFactor");
  const steps = options.steps ?? 41;
  if (!Number.isInteger(steps) || steps < 2 || steps > 401) throw AppError.field("steps", "must be an integer from 2 to 401");
  for (const key of Object.keys(options.fixed ?? {})) if (!names.includes(key)) throw AppError.field(`fixed.${key}`, "is not one of the factors");
  const ranges = studiedRanges(model);
  const [x0, x1] = axisRange(factors[ix]!, options.xRange, ranges[ix]!, "xRange");
  const [y0, y1] = axisRange(factors[iy]!, options.yRange, ranges[iy]!, "yRange");
  const axis = (a: number, b: number) => Array.from({ length: steps }, (_, i) => (i === steps - 1 ? b : a + ((b - a) * i) / (steps - 1)));
  const xCoded = axis(x0, x1);
  const yCoded = axis(y0, y1);
  const point = factors.map((f, i) => {
    const v = options.fixed?.[f.name];
    if (v === undefined || i === ix || i === iy) return 0;
    if (!Number.isFinite(v) || (f.scale === "log" && !(v > 0))) throw AppError.field(`fixed.${f.name}`, "must be a finite (and for a log-scale factor positive) number");
    return codeValue(f, v);
  });
  const fixed: Record<string, number> = {};
  factors.forEach((f, i) => {
    if (i !== ix && i !== iy) fixed[f.name] = options.fixed?.[f.name] ?? decodeValue(f, 0);
  });
  const xNatural = xCoded.map((v) => decodeValue(factors[ix]!, v));
  const yNatural = yCoded.map((v) => decodeValue(factors[iy]!, v));
  const back = (v: number) => (model.transform === "ln" ? Math.exp(v) : v);
  const cautions: GridCaution[] = [];
  const cautionIndex = new Map<string, number>();
  const z: number[][] = [];
  const extrapolated: boolean[][] = [];
  const blocked: number[][][] | null = options.safety ? [] : null;
  for (let j = 0; j < steps; j++) {
    const zRow: number[] = [];
    const eRow: boolean[] = [];
    const bRow: number[][] = [];
    point[iy] = yCoded[j]!;
    for (let i = 0; i < steps; i++) {
      point[ix] = xCoded[i]!;
      zRow.push(back(predictModelScale(model, point)));
      eRow.push(outsideStudied(ranges, point).length > 0);
      if (options.safety) {
        const natural = { ...fixed, [options.xFactor]: xNatural[i]!, [options.yFactor]: yNatural[j]! };
        const here: number[] = [];
        for (const c of options.safety(natural).blocking) {
          let k = cautionIndex.get(c.code);
          if (k === undefined) {
            k = cautions.length;
            cautionIndex.set(c.code, k);
            cautions.push({ code: c.code, message: c.message, points: 0 });
          }
          if (!here.includes(k)) {
            here.push(k);
            cautions[k]!.points++;
          }
        }
        bRow.push(here);
      }
    }
    z.push(zRow);
    extrapolated.push(eRow);
    blocked?.push(bRow);
  }
  return {
    xFactor: options.xFactor,
    yFactor: options.yFactor,
    xCoded,
    yCoded,
    xNatural,
    yNatural,
    fixed,
    studied: {
      x: [decodeValue(factors[ix]!, ranges[ix]!.lo), decodeValue(factors[ix]!, ranges[ix]!.hi)],
      y: [decodeValue(factors[iy]!, ranges[iy]!.lo), decodeValue(factors[iy]!, ranges[iy]!.hi)],
    },
    z,
    extrapolated,
    blocked,
    cautions,
  };
}
