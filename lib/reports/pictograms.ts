/**
 * The nine GHS pictograms drawn as vectors, our own simple drawings of the open
 * standard (UN GHS Rev. 10, Annex 3 section 3: a black symbol on a white background
 * inside a red-framed square set on a point). One module for every picture of them: the
 * React component (components/ghs/ghs-pictogram.tsx) draws these shapes as JSX, the PDF
 * reports embed `pictogramSvg(code)` as an SVG node.
 *
 * Geometry: a 100 × 100 box; the frame is the diamond through (50, 4), (96, 50), (50, 96),
 * (4, 50); each symbol stays inside |x − 50| + |y − 50| ≤ 36.
 *
 * Pure: imports nothing from the app's frameworks.
 */
import { GHS_PICTOGRAM_NAMES, type GhsPictogram } from "../hazards/ghs-pictograms";

/** One filled or stroked element of a symbol. */
export type PictogramShape =
  | { kind: "path"; d: string; fill: "black" | "white" | "none"; stroke?: "black" | "white"; strokeWidth?: number }
  | { kind: "circle"; cx: number; cy: number; r: number; fill: "black" | "white" | "none"; stroke?: "black" | "white"; strokeWidth?: number };

export interface PictogramArt {
  code: GhsPictogram;
  name: string;
  /** Drawn in order, inside an optional group transform. */
  shapes: PictogramShape[];
  transform?: string;
}

/** The red of the frame (the GHS asks for a red frame, no exact shade). */
export const PICTOGRAM_RED = "#e3001b";
/** The frame's diamond and its stroke width in the 100 × 100 box. */
export const PICTOGRAM_FRAME = { points: "50,4 96,50 50,96 4,50", strokeWidth: 7 } as const;

/** A star (burst) path: `n` points between radii `r1` (outer) and `r2` (inner), first point straight up. */
function star(cx: number, cy: number, n: number, r1: number, r2: number, rotateDeg = 0): string {
  const pts: string[] = [];
  for (let i = 0; i < 2 * n; i++) {
    const a = ((rotateDeg - 90) * Math.PI) / 180 + (i * Math.PI) / n;
    const r = i % 2 === 0 ? r1 : r2;
    pts.push(`${(cx + r * Math.cos(a)).toFixed(2)},${(cy + r * Math.sin(a)).toFixed(2)}`);
  }
  return `M${pts.join(" L")} Z`;
}

/** A bone from (x1, y1) to (x2, y2): a bar with two knobs at each end. */
function bone(x1: number, y1: number, x2: number, y2: number, w: number, knob: number): PictogramShape[] {
  const dx = x2 - x1;
  const dy = y2 - y1;
  const len = Math.hypot(dx, dy);
  const nx = (-dy / len) * (w / 2);
  const ny = (dx / len) * (w / 2);
  const kx = (-dy / len) * knob * 0.8;
  const ky = (dx / len) * knob * 0.8;
  const p = (x: number, y: number) => `${x.toFixed(2)},${y.toFixed(2)}`;
  return [
    { kind: "path", d: `M${p(x1 + nx, y1 + ny)} L${p(x2 + nx, y2 + ny)} L${p(x2 - nx, y2 - ny)} L${p(x1 - nx, y1 - ny)} Z`, fill: "black" },
    { kind: "circle", cx: x1 + kx, cy: y1 + ky, r: knob, fill: "black" },
    { kind: "circle", cx: x1 - kx, cy: y1 - ky, r: knob, fill: "black" },
    { kind: "circle", cx: x2 + kx, cy: y2 + ky, r: knob, fill: "black" },
    { kind: "circle", cx: x2 - kx, cy: y2 - ky, r: knob, fill: "black" },
  ];
}

/** A flame whose base sits at (cx, baseY), `h` high and about `h`·0.6 wide, with a white inner tongue. */
function flame(cx: number, baseY: number, h: number): PictogramShape[] {
  const s = h / 44;
  const X = (x: number) => (cx + (x - 50) * s).toFixed(2);
  const Y = (y: number) => (baseY + (y - 66) * s).toFixed(2);
  const pt = (x: number, y: number) => `${X(x)},${Y(y)}`;
  return [
    {
      kind: "path",
      fill: "black",
      d:
        `M${pt(50, 66)} C${pt(38, 66)} ${pt(33, 58)} ${pt(34, 50)} C${pt(35, 43)} ${pt(40, 39)} ${pt(41, 32)} ` +
        `C${pt(45, 36)} ${pt(46, 41)} ${pt(45, 46)} C${pt(48, 40)} ${pt(51, 33)} ${pt(48, 22)} ` +
        `C${pt(58, 28)} ${pt(62, 37)} ${pt(59, 47)} C${pt(62, 45)} ${pt(63, 41)} ${pt(63, 37)} ` +
        `C${pt(68, 44)} ${pt(68, 52)} ${pt(66, 57)} C${pt(63, 63)} ${pt(57, 66)} ${pt(50, 66)} Z`,
    },
    {
      kind: "path",
      fill: "white",
      d:
        `M${pt(50, 62.5)} C${pt(45.5, 62.5)} ${pt(42.5, 59.5)} ${pt(43, 55.5)} C${pt(43.5, 52)} ${pt(46.5, 50)} ${pt(47.5, 46)} ` +
        `C${pt(51.5, 49)} ${pt(54.5, 52.5)} ${pt(54, 56)} C${pt(55.5, 55)} ${pt(56.5, 53.5)} ${pt(56.5, 52)} ` +
        `C${pt(58.5, 55)} ${pt(58, 59.5)} ${pt(55, 61.5)} C${pt(53.5, 62.3)} ${pt(52, 62.5)} ${pt(50, 62.5)} Z`,
    },
  ];
}

const ART: Record<GhsPictogram, Omit<PictogramArt, "code" | "name">> = {
  // Exploding bomb: a ball with a fuse burst and flying fragments.
  GHS01: {
    shapes: [
      { kind: "path", fill: "black", d: star(57, 43, 9, 19, 8, 10) },
      { kind: "circle", cx: 43, cy: 58, r: 12.5, fill: "black", stroke: "white", strokeWidth: 2.5 },
      { kind: "path", fill: "black", d: "M30,33 L36,35 L33,40 Z" },
      { kind: "path", fill: "black", d: "M72,57 L77,52 L76,60 Z" },
      { kind: "path", fill: "black", d: "M58,66 L63,63 L63,69 Z" },
      { kind: "path", fill: "black", d: "M44,24 L49,27 L44,30 Z" },
      { kind: "path", fill: "white", d: "M37,53 C38,50 41,48 44,48 L44,50.5 C42,50.5 40,52 39.5,54 Z" },
    ],
  },
  // Flame on a base line.
  GHS02: {
    shapes: [...flame(50, 66, 46), { kind: "path", fill: "black", d: "M35,69 H65 V73 H35 Z" }],
  },
  // Flame over a circle, on a base line.
  GHS03: {
    shapes: [
      ...flame(50, 50, 30),
      { kind: "circle", cx: 50, cy: 57, r: 9.5, fill: "white", stroke: "black", strokeWidth: 4.5 },
      { kind: "path", fill: "black", d: "M35,70 H65 V74 H35 Z" },
    ],
  },
  // Gas cylinder lying at a slant, valve to the right.
  GHS04: {
    transform: "rotate(-18 50 52)",
    shapes: [
      { kind: "path", fill: "black", d: "M31,45 H63 A8,8 0 0 1 63,61 H31 A8,8 0 0 1 31,45 Z" },
      { kind: "path", fill: "black", d: "M70,49.5 H74 V56.5 H70 Z" },
      { kind: "path", fill: "black", d: "M74,47 H79 V59 H74 Z" },
      { kind: "path", fill: "white", d: "M31,48.5 H58 V50.5 H31 Z" },
    ],
  },
  // Corrosion: two tubes pouring drops onto a bar of metal and onto a hand, both eaten away.
  GHS05: {
    shapes: [
      // the tubes, tipped towards the middle, mouths down
      { kind: "path", fill: "none", stroke: "black", strokeWidth: 7, d: "M30,25 L41,36" },
      { kind: "path", fill: "none", stroke: "black", strokeWidth: 7, d: "M70,25 L59,36" },
      // drops
      { kind: "path", fill: "black", d: "M40,42 C42.5,46 43.5,48.5 40,49.5 C36.5,48.5 37.5,46 40,42 Z" },
      { kind: "path", fill: "black", d: "M60,42 C62.5,46 63.5,48.5 60,49.5 C56.5,48.5 57.5,46 60,42 Z" },
      // a bar of metal with a bite out of its top
      { kind: "path", fill: "black", d: "M27,54 H36.5 C37.5,57.5 42.5,57.5 43.5,54 H47 V63 H27 Z" },
      // a hand, palm down, fingers to the right, with a bite
      {
        kind: "path",
        fill: "black",
        d: "M52,63 V57 C52,54.5 53.5,53 56,53 H57.5 C58.5,56 62,56 63,53 H70 C71.8,53 71.8,55.6 70,55.6 H66 V56 H72 C73.8,56 73.8,58.6 72,58.6 H66 V59 H71 C72.6,59 72.6,61.4 71,61.4 H66 C66,62.6 65.4,63 64,63 Z",
      },
      // the surface both lie on
      { kind: "path", fill: "black", d: "M31,66 H69 V70 H31 Z" },
    ],
  },
  // Skull and crossbones.
  GHS06: {
    shapes: [
      ...bone(35, 56, 65, 72, 4.5, 3.2),
      ...bone(35, 72, 65, 56, 4.5, 3.2),
      { kind: "path", fill: "black", d: "M50,22 C60,22 66,29 66,38 C66,44 62,47 60,48.5 V53 C60,55 58,56 56,56 H44 C42,56 40,55 40,53 V48.5 C38,47 34,44 34,38 C34,29 40,22 50,22 Z" },
      { kind: "circle", cx: 44, cy: 38.5, r: 4.3, fill: "white" },
      { kind: "circle", cx: 56, cy: 38.5, r: 4.3, fill: "white" },
      { kind: "path", fill: "white", d: "M50,43.5 L52.5,48 H47.5 Z" },
      { kind: "path", fill: "white", d: "M45.2,51 H46.8 V56 H45.2 Z M49.2,51 H50.8 V56 H49.2 Z M53.2,51 H54.8 V56 H53.2 Z" },
    ],
  },
  // Exclamation mark.
  GHS07: {
    shapes: [
      { kind: "path", fill: "black", d: "M44.5,27 C44.5,21 55.5,21 55.5,27 L53,57 H47 Z" },
      { kind: "circle", cx: 50, cy: 66, r: 5.2, fill: "black" },
    ],
  },
  // Health hazard: a bust with a burst on the chest.
  GHS08: {
    shapes: [
      { kind: "circle", cx: 50, cy: 28, r: 7.5, fill: "black" },
      { kind: "path", fill: "black", d: "M35,70 C33,62 33.5,50 38,44 C41,40.5 45,39 50,39 C55,39 59,40.5 62,44 C66.5,50 67,62 65,70 Z" },
      { kind: "path", fill: "white", d: star(50, 56, 8, 10, 3.6, 0) },
    ],
  },
  // Environment: a bare tree and a dead fish on the ground line.
  GHS09: {
    shapes: [
      { kind: "path", fill: "none", stroke: "black", strokeWidth: 3, d: "M38,66 V34" },
      { kind: "path", fill: "none", stroke: "black", strokeWidth: 2, d: "M38,44 L30,36 M38,40 L45,31 M38,52 L46,45 M38,50 L31,46 M30,36 L28,31 M45,31 L47,27" },
      { kind: "path", fill: "black", d: "M47,58 C50,52 59,51 64,55 L71,51 L69,58 L71,65 L64,61 C59,65 50,64 47,58 Z" },
      { kind: "path", fill: "none", stroke: "white", strokeWidth: 1.3, d: "M51.5,55.3 L54.5,58.3 M54.5,55.3 L51.5,58.3" },
      { kind: "path", fill: "black", d: "M30,66 H70 V69.5 H30 Z" },
    ],
  },
};

/** The drawing of a pictogram. */
export function pictogramArt(code: GhsPictogram): PictogramArt {
  return { code, name: GHS_PICTOGRAM_NAMES[code], ...ART[code] };
}

function attr(shape: PictogramShape): string {
  const stroke = shape.stroke ? ` stroke="${shape.stroke}" stroke-width="${shape.strokeWidth ?? 1}" stroke-linecap="round" stroke-linejoin="round"` : "";
  return ` fill="${shape.fill}"${stroke}`;
}

/** The SVG elements of a pictogram (frame and symbol) in the 100 × 100 box, without the outer <svg>. */
export function pictogramSvgBody(code: GhsPictogram): string {
  const art = pictogramArt(code);
  const shapes = art.shapes
    .map((s) => (s.kind === "path" ? `<path d="${s.d}"${attr(s)}/>` : `<circle cx="${s.cx}" cy="${s.cy}" r="${s.r}"${attr(s)}/>`))
    .join("");
  const symbol = art.transform ? `<g transform="${art.transform}">${shapes}</g>` : shapes;
  return (
    `<polygon points="${PICTOGRAM_FRAME.points}" fill="white" stroke="${PICTOGRAM_RED}" stroke-width="${PICTOGRAM_FRAME.strokeWidth}" stroke-linejoin="miter"/>` +
    symbol
  );
}

/** A whole SVG document of a pictogram, `size` user units square (points in a PDF). */
export function pictogramSvg(code: GhsPictogram, size = 100): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 100 100"><title>${code} ${GHS_PICTOGRAM_NAMES[code]}</title>${pictogramSvgBody(code)}</svg>`;
}
