/**
 * Units of stock. Amounts are held as integer base units — micrograms (µg) for mass,
 * nanolitres (nL) for volume — so sums and differences are exact. The factor from each
 * accepted unit to its base comes from convert-units (mass to "mcg", volume to "mm3" = µL).
 */
import convert from "convert-units";
import { ceil, div, mul, parseDecimal, rational, toDecimalString, type Rational } from "./decimal";

export type Dimension = "mass" | "volume";

/** The unit names people type, mapped to convert-units' names. */
const ALIASES: Record<string, { dimension: Dimension; cu: convert.Unit; label: string }> = {
  "µg": { dimension: "mass", cu: "mcg", label: "µg" },
  ug: { dimension: "mass", cu: "mcg", label: "µg" },
  mcg: { dimension: "mass", cu: "mcg", label: "µg" },
  mg: { dimension: "mass", cu: "mg", label: "mg" },
  g: { dimension: "mass", cu: "g", label: "g" },
  kg: { dimension: "mass", cu: "kg", label: "kg" },
  "µl": { dimension: "volume", cu: "mm3", label: "µL" },
  ul: { dimension: "volume", cu: "mm3", label: "µL" },
  ml: { dimension: "volume", cu: "ml", label: "mL" },
  l: { dimension: "volume", cu: "l", label: "L" },
};

/** The units accepted for amounts, as shown. */
export const STOCK_UNITS = ["µg", "mg", "g", "kg", "µL", "mL", "L"] as const;
export type StockUnit = (typeof STOCK_UNITS)[number];

export interface UnitInfo {
  dimension: Dimension;
  /** The unit as Tareline writes it (µg, mg, g, kg, µL, mL, L). */
  label: StockUnit;
  /** Base units (µg or nL) in one of this unit: an exact integer. */
  factor: bigint;
}

const cache = new Map<string, UnitInfo>();

/**
 * Looks up a unit by what people type (case-insensitive, "u" for "µ"): mg, g, kg, µg,
 * µL, mL, L. Returns null for anything else (oz, mol, "", …).
 */
export function unitInfo(unit: string): UnitInfo | null {
  const key = unit.trim().replace(/μ/g, "µ").toLowerCase();
  const hit = cache.get(key);
  if (hit) return hit;
  const alias = ALIASES[key];
  if (!alias) return null;
  // convert-units gives µg per unit (mass) or µL per unit (volume); nL = µL × 1000.
  const raw = alias.dimension === "mass" ? convert(1).from(alias.cu).to("mcg") : convert(1).from(alias.cu).to("mm3") * 1000;
  const factor = BigInt(Math.round(raw));
  const info: UnitInfo = { dimension: alias.dimension, label: alias.label as StockUnit, factor };
  cache.set(key, info);
  return info;
}

/**
 * An amount written as a decimal in `unit`, in exact base units (µg or nL). Amounts finer
 * than one base unit are rounded up.
 * @throws RangeError for an unknown unit or a value that is not a decimal number.
 */
export function toBase(value: string | number, unit: string): { base: bigint; dimension: Dimension } {
  const info = unitInfo(unit);
  if (!info) throw new RangeError(`unknown unit "${unit}"`);
  return { base: ceil(mul(parseDecimal(value), rational(info.factor))), dimension: info.dimension };
}

/** Base units as an exact rational in `unit` (which must be of the same dimension). */
export function fromBase(base: bigint, unit: string): Rational {
  const info = unitInfo(unit);
  if (!info) throw new RangeError(`unknown unit "${unit}"`);
  return div(rational(base), rational(info.factor));
}

/** The unit Tareline shows an amount in when nobody chose one: g/mg for mass, mL/µL for volume. */
export function naturalUnit(base: bigint, dimension: Dimension): StockUnit {
  const abs = base < 0n ? -base : base;
  if (dimension === "mass") return abs >= 1_000_000_000n ? "kg" : abs >= 1_000_000n ? "g" : abs >= 1_000n ? "mg" : "µg";
  return abs >= 1_000_000_000n ? "L" : abs >= 1_000_000n ? "mL" : "µL";
}

/**
 * Writes base units as "12.5 mg" in `unit` (default: the natural unit), exact to
 * `digits` fraction digits.
 */
export function formatAmount(base: bigint, dimension: Dimension, unit?: string, digits = 3): string {
  const shown = unit && unitInfo(unit)?.dimension === dimension ? unitInfo(unit)!.label : naturalUnit(base, dimension);
  return `${toDecimalString(fromBase(base, shown), digits)} ${shown}`;
}

/** The base unit's name: µg for mass, nL for volume. */
export function baseUnitName(dimension: Dimension): "µg" | "nL" {
  return dimension === "mass" ? "µg" : "nL";
}
