/**
 * A response surface on a grid, for contour and surface plots: the fitted model
 * evaluated over two factors (each from its low to its high limit, or over a coded
 * span), the other factors held at given coded values (default the centre).
 */
import { AppError } from "../errors/app-error";
import { decodeValue } from "../doe/factors";
import type { FittedModel } from "../stats/fitted-model";
import { predictModelScale } from "../stats/predict";

export interface SurfaceGridOptions {
  xFactor: string;
  yFactor: string;
  /** Points per axis (default 41, 2…401). */
  steps?: number;
  /** Coded half-width of the plotted square (default 1: the factor box). */
  span?: number;
  /** Coded values of the other factors (default 0). */
  fixed?: Record<string, number>;
}

export interface SurfaceGrid {
  xFactor: string;
  yFactor: string;
  /** Coded and natural axis values. */
  xCoded: number[];
  yCoded: number[];
  xNatural: number[];
  yNatural: number[];
  /** z[j][i]: predicted response (original scale) at (x_i, y_j). */
  z: number[][];
}

/**
 * Evaluates the model on an even grid over two factors. Throws an invalid-input
 * AppError for an unknown or repeated factor name or a bad step count.
 * Example: surfaceGrid(model, { xFactor: "temperature", yFactor: "time", steps: 21 })
 */
export function surfaceGrid(model: FittedModel, options: SurfaceGridOptions): SurfaceGrid {
  const names = model.factors.map((f) => f.name);
  const ix = names.indexOf(options.xFactor);
  const iy = names.indexOf(options.yFactor);
  if (ix < 0) throw AppError.field("xFactor", "is not one of the factors");
  if (iy < 0) throw AppError.field("yFactor", "is not one of the factors");
  if (ix === iy) throw AppError.field("yFactor", "must differ from xFactor");
  const steps = options.steps ?? 41;
  if (!Number.isInteger(steps) || steps < 2 || steps > 401) throw AppError.field("steps", "must be an integer from 2 to 401");
  const span = options.span ?? 1;
  if (!(span > 0)) throw AppError.field("span", "must be positive");
  const axis = Array.from({ length: steps }, (_, i) => -span + (2 * span * i) / (steps - 1));
  const x = names.map((n) => options.fixed?.[n] ?? 0);
  const back = (v: number) => (model.transform === "ln" ? Math.exp(v) : v);
  const z = axis.map((yv) =>
    axis.map((xv) => {
      x[ix] = xv;
      x[iy] = yv;
      return back(predictModelScale(model, x));
    }),
  );
  return {
    xFactor: options.xFactor,
    yFactor: options.yFactor,
    xCoded: axis,
    yCoded: [...axis],
    xNatural: axis.map((v) => decodeValue(model.factors[ix]!, v)),
    yNatural: axis.map((v) => decodeValue(model.factors[iy]!, v)),
    z,
  };
}
