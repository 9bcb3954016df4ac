/** Natural factor values in words, for messages: "temperature 85.2 degC, time 3.1 h". */
import { displayUnit } from "../units/display-unit";
import { decodeValue, type Factor } from "./factors";

/** A number to 4 significant digits without trailing zeros (−0 as 0). */
export function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const r = Number(v.toPrecision(4));
  return String(Object.is(r, -0) ? 0 : r).replace("-", "−");
}

/** One factor's natural value with its unit. */
export function formatFactorValue(f: Factor, natural: number): string {
  const unit = displayUnit(f.unit);
  return `${f.name} ${formatNumber(natural)}${unit ? ` ${unit}` : ""}`;
}

/** A coded point (factor order) as natural values with units. */
export function formatNatural(factors: readonly Factor[], coded: readonly number[]): string {
  return factors.map((f, i) => formatFactorValue(f, decodeValue(f, coded[i]!))).join(", ");
}
