/**
 * A region of a surface grid (the points where some caution blocks, or that lie outside
 * the lab's limits) as outlines for a chart: marching squares on the grid's mask at the
 * level ½ (d3-contour, Bostock et al.), so an edge runs halfway between a marked sample
 * and an unmarked one, mapped to natural units by linear interpolation between the axis
 * samples; and a point well inside to put the region's label — the marked sample
 * farthest from any unmarked one and from the grid's border, the most central of ties (a chamfer 3-4 distance
 * transform: Borgefors, "Distance transformations in digital images", Computer Vision,
 * Graphics and Image Processing 34, 1986). Pure.
 */
import { contours } from "d3-contour";

export interface MaskRegion {
  /**
   * The outline as closed rings [x, y] in natural units (the last point repeats the
   * first). Outer rings and holes wind in opposite senses, so a fill with the non-zero
   * rule leaves the holes open.
   */
  rings: Array<Array<[number, number]>>;
  /** A point well inside the region (the marked sample farthest from its edge), or null when nothing is marked. */
  label: [number, number] | null;
  /** The share of the grid's samples marked (0…1). */
  share: number;
}

/** The natural value at a fractional sample index of an axis (clamped to its ends). */
function along(axis: readonly number[], t: number): number {
  const n = axis.length;
  if (t <= 0) return axis[0]!;
  if (t >= n - 1) return axis[n - 1]!;
  const i = Math.floor(t);
  return axis[i]! + (t - i) * (axis[i + 1]! - axis[i]!);
}

/** The mask flattened row by row (1 marked, 0 not), after checking its shape against the axes. */
function flatMask(mask: readonly (readonly boolean[])[], nx: number, ny: number): number[] {
  if (mask.length !== ny || mask.some((row) => row.length !== nx)) throw new RangeError("the mask must have one row per y sample and one column per x sample");
  const values = new Array<number>(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) values[j * nx + i] = mask[j]![i] ? 1 : 0;
  return values;
}

/** The label point of flattened samples: inside `labelMask` too when that meets them. */
function labelOf(values: readonly number[], nx: number, ny: number, xAxis: readonly number[], yAxis: readonly number[], labelMask?: readonly (readonly boolean[])[]): [number, number] {
  const inLabel = labelMask ? values.map((v, k) => (v && labelMask[Math.floor(k / nx)]?.[k % nx] ? 1 : 0)) : values;
  const [li, lj] = deepestSample(inLabel.some((v) => v === 1) ? inLabel : values, nx, ny);
  return [xAxis[li]!, yAxis[lj]!];
}

/**
 * The label point alone (no outline) of the samples where `mask[j][i]` holds, inside
 * `labelMask` too when that meets them; null when nothing is marked.
 * Example: maskLabel(mask, grid.xNatural, grid.yNatural)
 */
export function maskLabel(mask: readonly (readonly boolean[])[], xAxis: readonly number[], yAxis: readonly number[], labelMask?: readonly (readonly boolean[])[]): [number, number] | null {
  const values = flatMask(mask, xAxis.length, yAxis.length);
  return values.includes(1) ? labelOf(values, xAxis.length, yAxis.length, xAxis, yAxis, labelMask) : null;
}

/**
 * The outline of the samples where `mask[j][i]` holds (sample i along `xAxis`, j along
 * `yAxis`), with a label point (inside `labelMask` too, when given and it meets the region).
 * Example: maskRegion(grid.blocked!.map((row) => row.map((b) => b.length > 0)), grid.xNatural, grid.yNatural)
 */
export function maskRegion(mask: readonly (readonly boolean[])[], xAxis: readonly number[], yAxis: readonly number[], labelMask?: readonly (readonly boolean[])[]): MaskRegion {
  const nx = xAxis.length;
  const ny = yAxis.length;
  const values = flatMask(mask, nx, ny);
  const marked = values.reduce((s, v) => s + v, 0);
  if (marked === 0) return { rings: [], label: null, share: 0 };
  // d3-contour puts sample i at i + 0.5 and closes regions along the grid's border.
  const [shape] = contours().size([nx, ny]).thresholds([0.5])(values);
  const rings: Array<Array<[number, number]>> = [];
  for (const polygon of shape?.coordinates ?? []) {
    for (const ring of polygon) rings.push(ring.map((p): [number, number] => [along(xAxis, p[0]! - 0.5), along(yAxis, p[1]! - 0.5)]));
  }
  return { rings, label: labelOf(values, nx, ny, xAxis, yAxis, labelMask), share: marked / (nx * ny) };
}

/**
 * The marked sample farthest (chamfer 3-4 distance) from every unmarked sample and from
 * outside the grid; of several as far, the one nearest their centroid.
 */
function deepestSample(values: readonly number[], nx: number, ny: number): [number, number] {
  const BIG = 1e9;
  const d: number[] = values.map((v) => (v ? BIG : 0));
  const at = (i: number, j: number) => (i < 0 || j < 0 || i >= nx || j >= ny ? 0 : d[j * nx + i]!);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (!d[k]) continue;
      d[k] = Math.min(d[k]!, at(i - 1, j) + 3, at(i, j - 1) + 3, at(i - 1, j - 1) + 4, at(i + 1, j - 1) + 4);
    }
  let best = -1;
  for (let j = ny - 1; j >= 0; j--)
    for (let i = nx - 1; i >= 0; i--) {
      const k = j * nx + i;
      if (!d[k]) continue;
      d[k] = Math.min(d[k]!, at(i + 1, j) + 3, at(i, j + 1) + 3, at(i + 1, j + 1) + 4, at(i - 1, j + 1) + 4);
      best = Math.max(best, d[k]!);
    }
  const ties: Array<[number, number]> = [];
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) if (d[j * nx + i] === best) ties.push([i, j]);
  const ci = ties.reduce((s, t) => s + t[0], 0) / ties.length;
  const cj = ties.reduce((s, t) => s + t[1], 0) / ties.length;
  let pick = ties[0]!;
  let near = Infinity;
  for (const t of ties) {
    const e = (t[0] - ci) ** 2 + (t[1] - cj) ** 2;
    if (e < near) {
      near = e;
      pick = t;
    }
  }
  return pick;
}
