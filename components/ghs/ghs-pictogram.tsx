import { GHS_PICTOGRAM_NAMES, type GhsPictogram as GhsCode } from "@/lib/hazards/ghs-pictograms";
import { pictogramArt, PICTOGRAM_FRAME, PICTOGRAM_RED, type PictogramShape } from "@/lib/reports/pictograms";

function Shape({ s }: { s: PictogramShape }) {
  const stroke = s.stroke ? { stroke: s.stroke, strokeWidth: s.strokeWidth ?? 1, strokeLinecap: "round" as const, strokeLinejoin: "round" as const } : {};
  return s.kind === "path" ? <path d={s.d} fill={s.fill} {...stroke} /> : <circle cx={s.cx} cy={s.cy} r={s.r} fill={s.fill} {...stroke} />;
}

/** A GHS pictogram (UN GHS Annex 3) drawn from the shared vector drawings of lib/reports/pictograms.ts. */
export function GhsPictogram({ code, size = 32, className = "" }: { code: GhsCode; size?: number; className?: string }) {
  const art = pictogramArt(code);
  const label = `${code} ${GHS_PICTOGRAM_NAMES[code]}`;
  return (
    <svg width={size} height={size} viewBox="0 0 100 100" role="img" aria-label={label} className={className}>
      <title>{label}</title>
      <polygon points={PICTOGRAM_FRAME.points} fill="white" stroke={PICTOGRAM_RED} strokeWidth={PICTOGRAM_FRAME.strokeWidth} strokeLinejoin="miter" />
      <g transform={art.transform}>
        {art.shapes.map((s, i) => (
          <Shape key={i} s={s} />
        ))}
      </g>
    </svg>
  );
}
