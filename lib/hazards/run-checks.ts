/**
 * The caution rules that look at one vial's conditions: pressure, fill, boiling point,
 * extrapolated vapour pressure, flash and autoignition points. Shared by the plan's
 * cautions and the `vessel-pressure` verb. Each check returns "firings": one rule
 * matched once, with a message for this case and a score (larger = worse) that picks
 * the worst case's message when firings from many runs are merged.
 */
import { CAUTION_RULES, type CautionCode, type Severity } from "./caution-rules";
import type { SealedVesselEstimate } from "./sealed-vessel";
import { ATM_BAR, type MixturePart } from "./vapor-pressure";

export interface Firing {
  code: CautionCode;
  severity: Severity;
  component?: string;
  score: number;
  /** Writes the message; called only for the case that is shown (the worst one). */
  message: () => string;
}

/** Formats a number for a message (the report's numeric fields stay unrounded). */
export function fmt(x: number, digits = 2): string {
  return Number.isFinite(x) ? String(Number(x.toFixed(digits))) : String(x);
}

function fire(code: CautionCode, score: number, message: () => string, component?: string, severity?: Severity): Firing {
  return { code, severity: severity ?? CAUTION_RULES[code].severity, score, message, ...(component ? { component } : {}) };
}

/** A label for a solvent system, e.g. "1,4-dioxane + water". */
export function systemLabel(parts: readonly MixturePart[]): string {
  return parts
    .filter((p) => p.volumeFraction > 0)
    .map((p) => p.record.name)
    .join(" + ");
}

export interface VesselLimits {
  sealed: boolean;
  /** bar absolute; null when no rating is known (no pressure check). */
  ratedBar: number | null;
  safetyFactor: number;
  maxFillFraction: number;
}

/**
 * Pressure and fill rules for one vial: TL-V01 (sealed, above the boiling point:
 * Raoult vapour pressure above 1 atm), TL-V02 (total above rating × safety factor),
 * TL-V03 (fill at seal or hot above the maximum, or the liquid fills the vessel),
 * TL-V04 (a solvent's vapour pressure extrapolated or estimated).
 */
export function pressureFirings(
  est: SealedVesselEstimate,
  parts: readonly MixturePart[],
  temperatureC: number,
  limits: VesselLimits,
): Firing[] {
  const out: Firing[] = [];
  const label = systemLabel(parts);
  if (limits.sealed && est.vaporBar > ATM_BAR) {
    const nbp = parts
      .filter((p) => p.volumeFraction > 0)
      .map((p) => `${p.record.name} ${fmt(p.record.normalBoilingPointC.value, 1)} °C`)
      .join(", ");
    out.push(
      fire(
        "TL-V01",
        est.vaporBar,
        () => `At ${fmt(temperatureC, 1)} °C in a sealed vessel the solvent (${label}) is above its boiling point: estimated vapour pressure ${fmt(est.vaporBar)} bar, more than 1 atm (normal boiling point ${nbp}).`,
        label,
      ),
    );
  }
  if (limits.sealed && limits.ratedBar !== null && est.totalBar !== null) {
    const limit = limits.ratedBar * limits.safetyFactor;
    const total = est.totalBar;
    const rated = limits.ratedBar;
    if (total > limit) {
      out.push(
        fire(
          "TL-V02",
          total,
          () => `Estimated pressure at ${fmt(temperatureC, 1)} °C is ${fmt(total)} bar absolute (vapour ${fmt(est.vaporBar)}, air ${fmt(est.airBar ?? 0)}, released gas ${fmt(est.gasBar ?? 0)}), over the limit of ${fmt(limit)} bar (rating ${fmt(rated)} bar × safety factor ${fmt(limits.safetyFactor)}).`,
        ),
      );
    }
  }
  const fill = Math.max(est.fillFractionSeal, est.fillFractionHot);
  if (est.liquidFull && limits.sealed) {
    out.push(
      fire(
        "TL-V03",
        Math.max(fill, 1),
        () => `At ${fmt(temperatureC, 1)} °C the expanded liquid would fill the sealed vessel (${fmt(est.fillFractionHot * 100, 1)} % of its volume): the hydraulic pressure can burst it.`,
      ),
    );
  } else if (fill > limits.maxFillFraction) {
    out.push(
      fire(
        "TL-V03",
        fill,
        () => `The liquid fills ${fmt(est.fillFractionSeal * 100, 1)} % of the vessel when sealed and ${fmt(est.fillFractionHot * 100, 1)} % at ${fmt(temperatureC, 1)} °C, above the vessel's maximum of ${fmt(limits.maxFillFraction * 100, 1)} %.`,
      ),
    );
  }
  for (const part of est.vapor.parts) {
    if (part.moleFraction > 0 && !part.inRange) {
      const how =
        part.method === "estimate"
          ? "an estimate by Clausius–Clapeyron with Trouton's rule (no cited correlation)"
          : `extrapolated outside the stated range of its ${part.method} parameters`;
      out.push(
        fire(
          "TL-V04",
          Math.abs(temperatureC),
          () => `The vapour pressure of ${part.solvent} at ${fmt(temperatureC, 1)} °C (${fmt(part.pureBar, 3)} bar) is ${how}.`,
          part.solvent,
        ),
      );
    }
  }
  return out;
}

/**
 * Fire rules for one vial: TL-F01 (temperature above a solvent's flash point) and
 * TL-F02 (temperature at or above autoignition − margin), per solvent present.
 */
export function fireFirings(parts: readonly MixturePart[], temperatureC: number, autoignitionMarginC: number): Firing[] {
  const out: Firing[] = [];
  for (const p of parts) {
    if (p.volumeFraction <= 0) continue;
    const fp = p.record.flashPointC;
    if (fp && temperatureC > fp.value) {
      out.push(
        fire(
          "TL-F01",
          temperatureC - fp.value,
          () => `${fmt(temperatureC, 1)} °C is above the flash point of ${p.record.name} (${fmt(fp.value, 1)} °C): its vapour can be ignited.`,
          p.record.name,
        ),
      );
    }
    const ait = p.record.autoignitionC;
    if (ait && temperatureC >= ait.value - autoignitionMarginC) {
      out.push(
        fire(
          "TL-F02",
          temperatureC - ait.value,
          () => `${fmt(temperatureC, 1)} °C is within ${fmt(autoignitionMarginC, 1)} °C of the autoignition temperature of ${p.record.name} (${fmt(ait.value, 1)} °C): its vapour can ignite without a spark.`,
          p.record.name,
        ),
      );
    }
  }
  return out;
}
