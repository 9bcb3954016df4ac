/**
 * A contour plot of a response surface as an SVG document, drawn from the grid of
 * lib/surface/grid.ts: contour lines by marching squares (d3-contour, Bostock et al.;
 * the grid's values linearly interpolated), the region where a blocking caution fires
 * hatched in brick red and the region outside the lab's limits in graphite, labelled with
 * their codes where the caller places the labels, the extrapolated region (outside the
 * range of the runs) shaded, the design points and the optimum marked. Axes are even in
 * the grid's coded units (a log-scale factor is labelled in its natural values). Pure.
 */
import { contours } from "d3-contour";
import type { SurfaceGrid } from "../surface/grid";
import { displayUnit, significant } from "./format";
import { SHEET_COLORS } from "./vial-map-drawing";

export interface ContourOptions {
  width?: number;
  height?: number;
  /** Number of contour levels asked of d3 (nice values; default 10). */
  levels?: number;
  /** Units of the two axes' factors and of the response. */
  xUnit?: string;
  yUnit?: string;
  responseName?: string;
  responseUnit?: string;
  /** Design points and the optimum in natural values (by factor name). */
  points?: ReadonlyArray<Record<string, number>>;
  optimum?: Record<string, number> | null;
  font?: string;
  /**
   * The kind of each of the grid's cautions (by index): "limit" cells (a limit of the lab
   * left, no blocking caution) are hatched in graphite, the rest in brick red. Default: all
   * cautions.
   */
  cautionKinds?: ReadonlyArray<"caution" | "limit">;
  /** Labels to write inside the regions (natural [x, y] and the text, e.g. a caution's code). */
  labels?: ReadonlyArray<{ at: [number, number]; text: string; kind: "caution" | "limit" }>;
}

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** Where a natural value sits on an axis of grid samples, as a fractional index (linear between samples); null outside. */
function indexOf(axis: readonly number[], v: number): number | null {
  const n = axis.length;
  const asc = axis[n - 1]! >= axis[0]!;
  for (let i = 0; i < n - 1; i++) {
    const a = axis[i]!;
    const b = axis[i + 1]!;
    if ((asc && v >= a && v <= b) || (!asc && v <= a && v >= b)) return i + (b === a ? 0 : (v - a) / (b - a));
  }
  return null;
}

/** Ticks at `count` nice positions along an axis of samples: [index, label]. */
function ticks(axis: readonly number[], count: number): Array<[number, string]> {
  const n = axis.length;
  const out: Array<[number, string]> = [];
  for (let k = 0; k < count; k++) {
    const i = ((n - 1) * k) / (count - 1);
    const lo = Math.floor(i);
    const t = i - lo;
    const v = lo >= n - 1 ? axis[n - 1]! : axis[lo]! + t * (axis[lo + 1]! - axis[lo]!);
    out.push([i, significant(v, 3)]);
  }
  return out;
}

/** The contours of a field on the grid (index coordinates: sample i at i + 0.5) as SVG path data. */
function contourPaths(values: number[], nx: number, ny: number, thresholds: number[] | number, map: (x: number, y: number) => [number, number]) {
  const gen = contours().size([nx, ny]);
  if (typeof thresholds === "number") gen.thresholds(thresholds);
  else gen.thresholds(thresholds);
  return gen(values).map((mp) => {
    const d = mp.coordinates
      .map((poly) => poly.map((ring) => `M${ring.map((pt) => map(pt[0]! - 0.5, pt[1]! - 0.5).map((v) => v.toFixed(1)).join(",")).join("L")}Z`).join(""))
      .join("");
    // A point to label the level at: the first vertex of the longest ring.
    let label: [number, number] | null = null;
    let longest = 0;
    for (const poly of mp.coordinates) {
      const ring = poly[0];
      if (ring && ring.length > longest) {
        longest = ring.length;
        const mid = ring[Math.floor(ring.length / 3)]!;
        label = map(mid[0]! - 0.5, mid[1]! - 0.5);
      }
    }
    return { value: mp.value, d, label };
  });
}

/**
 * The contour plot of `grid` as a standalone SVG document.
 * Example: contourSvg(surfaceGrid(model, { xFactor: "temperature", yFactor: "time", steps: 61, safety }), { responseName: "yield", responseUnit: "%" })
 */
export function contourSvg(grid: SurfaceGrid, options: ContourOptions = {}): string {
  const W = options.width ?? 480;
  const H = options.height ?? 360;
  const font = esc(options.font ?? "sans-serif");
  const m = { left: 52, right: 16, top: 14, bottom: 40 };
  const pw = W - m.left - m.right;
  const ph = H - m.top - m.bottom;
  const nx = grid.xNatural.length;
  const ny = grid.yNatural.length;
  // Index coordinates (0 … n−1 at the samples) → plot coordinates, y upwards.
  const map = (i: number, j: number): [number, number] => [m.left + (i / (nx - 1)) * pw, m.top + ph - (j / (ny - 1)) * ph];
  const flatten = (f: (i: number, j: number) => number) => {
    const out: number[] = new Array(nx * ny);
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) out[j * nx + i] = f(i, j);
    return out;
  };
  const z = flatten((i, j) => grid.z[j]![i]!);
  const finite = z.filter(Number.isFinite);
  const lines = finite.length > 0 ? contourPaths(z.map((v) => (Number.isFinite(v) ? v : NaN)), nx, ny, options.levels ?? 10, map) : [];
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  parts.push(
    `<defs><clipPath id="plot"><rect x="${m.left}" y="${m.top}" width="${pw}" height="${ph}"/></clipPath>` +
      `<pattern id="hatch" patternUnits="userSpaceOnUse" width="7" height="7"><rect width="7" height="7" fill="#f4d9d3"/><path d="M-1,1 L1,-1 M0,7 L7,0 M6,8 L8,6" stroke="#9c3324" stroke-width="1.2"/></pattern>` +
      `<pattern id="limit" patternUnits="userSpaceOnUse" width="7" height="7"><path d="M-1,6 L1,8 M0,0 L7,7 M6,-1 L8,1" stroke="#3d3c40" stroke-width="1"/></pattern>` +
      `<pattern id="extra" patternUnits="userSpaceOnUse" width="5" height="5"><rect width="5" height="5" fill="#ebe3d3"/><circle cx="2.5" cy="2.5" r="0.7" fill="${SHEET_COLORS.faint}"/></pattern></defs>`,
  );
  parts.push(`<rect x="${m.left}" y="${m.top}" width="${pw}" height="${ph}" fill="#ffffff" stroke="${SHEET_COLORS.ink}" stroke-width="0.8"/>`);
  parts.push(`<g clip-path="url(#plot)">`);
  // Extrapolated region: shaded under everything else.
  const ext = flatten((i, j) => (grid.extrapolated[j]![i] ? 1 : 0));
  if (ext.some((v) => v === 1)) for (const c of contourPaths(ext, nx, ny, [0.5], map)) parts.push(`<path d="${c.d}" fill="url(#extra)" stroke="none"/>`);
  // Unsafe region: hatched, outlined in brick red.
  // Blocking cautions hatched in brick red; outside the lab's limits hatched the other way, in graphite, dashed.
  if (grid.blocked) {
    const blocked = grid.blocked;
    const kinds = options.cautionKinds ?? [];
    const isLimit = (k: number) => kinds[k] === "limit";
    const b = flatten((i, j) => (blocked[j]![i]!.some((k) => !isLimit(k)) ? 1 : 0));
    if (b.some((v) => v === 1)) for (const c of contourPaths(b, nx, ny, [0.5], map)) parts.push(`<path d="${c.d}" fill="url(#hatch)" stroke="#9c3324" stroke-width="1.2"/>`);
    // On top, lines only: where both apply the hatches cross.
    const lim = flatten((i, j) => (blocked[j]![i]!.some(isLimit) ? 1 : 0));
    if (lim.some((v) => v === 1)) for (const c of contourPaths(lim, nx, ny, [0.5], map)) parts.push(`<path d="${c.d}" fill="url(#limit)" stroke="#3d3c40" stroke-width="1.1" stroke-dasharray="4 2"/>`);
  }
  for (const c of lines) {
    parts.push(`<path d="${c.d}" fill="none" stroke="#2b5c9e" stroke-width="0.9"/>`);
    if (c.label) {
      // The level on a white patch (svg-to-pdfkit draws no paint-order halo).
      const [lx, ly] = c.label;
      const label = esc(significant(c.value, 4));
      const w = label.length * 4.3 + 3;
      parts.push(
        `<rect x="${(lx - w / 2).toFixed(1)}" y="${(ly - 6).toFixed(1)}" width="${w.toFixed(1)}" height="8.5" fill="#ffffff"/>` +
          `<text x="${lx.toFixed(1)}" y="${(ly + 0.8).toFixed(1)}" font-family="${font}" font-size="7.5" text-anchor="middle" fill="#1d2f4a">${label}</text>`,
      );
    }
  }
  for (const p of options.points ?? []) {
    const i = indexOf(grid.xNatural, p[grid.xFactor] ?? NaN);
    const j = indexOf(grid.yNatural, p[grid.yFactor] ?? NaN);
    if (i === null || j === null) continue;
    const [x, y] = map(i, j);
    parts.push(`<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="2.6" fill="${SHEET_COLORS.ink}" stroke="#ffffff" stroke-width="0.8"/>`);
  }
  if (options.optimum) {
    const i = indexOf(grid.xNatural, options.optimum[grid.xFactor] ?? NaN);
    const j = indexOf(grid.yNatural, options.optimum[grid.yFactor] ?? NaN);
    if (i !== null && j !== null) {
      const [x, y] = map(i, j);
      parts.push(`<path d="M${x - 6},${y} H${x + 6} M${x},${y - 6} V${y + 6}" stroke="#2f4a6d" stroke-width="2.2"/><circle cx="${x}" cy="${y}" r="4.5" fill="none" stroke="#2f4a6d" stroke-width="1.6"/>`);
    }
  }
  for (const l of options.labels ?? []) {
    const i = indexOf(grid.xNatural, l.at[0]);
    const j = indexOf(grid.yNatural, l.at[1]);
    if (i === null || j === null) continue;
    const [x, y] = map(i, j);
    const text = esc(l.text);
    const w = text.length * 4.6 + 6;
    const colour = l.kind === "limit" ? "#3d3c40" : "#9c3324";
    parts.push(
      `<rect x="${(x - w / 2).toFixed(1)}" y="${(y - 7).toFixed(1)}" width="${w.toFixed(1)}" height="10" fill="#ffffff" stroke="${colour}" stroke-width="0.7"/>` +
        `<text x="${x.toFixed(1)}" y="${(y + 0.6).toFixed(1)}" font-family="${font}" font-size="7.5" font-weight="bold" text-anchor="middle" fill="${colour}">${text}</text>`,
    );
  }
  parts.push(`</g>`);
  for (const [i, label] of ticks(grid.xNatural, 5)) {
    const [x] = map(i, 0);
    parts.push(`<path d="M${x.toFixed(1)},${m.top + ph} v4" stroke="${SHEET_COLORS.ink}" stroke-width="0.8"/><text x="${x.toFixed(1)}" y="${m.top + ph + 13}" font-family="${font}" font-size="8" text-anchor="middle" fill="${SHEET_COLORS.ink}">${esc(label)}</text>`);
  }
  for (const [j, label] of ticks(grid.yNatural, 5)) {
    const [, y] = map(0, j);
    parts.push(`<path d="M${m.left},${y.toFixed(1)} h-4" stroke="${SHEET_COLORS.ink}" stroke-width="0.8"/><text x="${m.left - 6}" y="${(y + 3).toFixed(1)}" font-family="${font}" font-size="8" text-anchor="end" fill="${SHEET_COLORS.ink}">${esc(label)}</text>`);
  }
  const xu = displayUnit(options.xUnit);
  const yu = displayUnit(options.yUnit);
  parts.push(`<text x="${m.left + pw / 2}" y="${H - 8}" font-family="${font}" font-size="9" text-anchor="middle" fill="${SHEET_COLORS.ink}">${esc(`${grid.xFactor}${xu ? ` (${xu})` : ""}`)}</text>`);
  parts.push(`<text transform="translate(12 ${m.top + ph / 2}) rotate(-90)" font-family="${font}" font-size="9" text-anchor="middle" fill="${SHEET_COLORS.ink}">${esc(`${grid.yFactor}${yu ? ` (${yu})` : ""}`)}</text>`);
  parts.push(`</svg>`);
  return parts.join("");
}
