/**
 * How much of a requirement one base unit (µg or nL) of a container provides.
 *
 * A requirement is an amount of substance (mmol), a mass or a volume. A container holds a
 * solid or neat liquid (by mass or by volume, purity p) or a solution (by volume, with a
 * molar concentration c in mol/L or a mass concentration in mg/mL). With molar mass M
 * (g/mol) and density ρ (g/mL), per base unit of the container:
 *
 * | container | mmol | mass (µg) | volume (nL) |
 * |---|---|---|---|
 * | neat, by mass (per µg) | p·10⁻³/M | 1 | 1/ρ |
 * | neat, by volume (per nL) | ρ·p·10⁻³/M | ρ | 1 |
 * | solution c mol/L (per nL) | c·10⁻⁶ | c·M·10⁻³ (solute) | 1 |
 * | solution c mg/mL (per nL) | c·10⁻³/M | c (solute) | 1 |
 *
 * (1 µg = 10⁻³ mg, mmol = mg / M; 1 nL = 10⁻⁶ mL = 10⁻⁹ L.) A mass requirement means the
 * mass to take from a neat container (the run sheet's purity-corrected mass) or the mass
 * of solute from a solution.
 */
import { div, mul, parseDecimal, rational, type Rational } from "./decimal";
import type { Dimension } from "./units";

export type Measure = "mmol" | "mass" | "volume";

export interface ContainerChemistry {
  dimension: Dimension;
  /** Purity in percent (null = 100 %). */
  purityPercent: string | null;
  /** Solution concentration, or null for a neat material. */
  concentration: string | null;
  concentrationUnit: "M" | "mg/mL" | null;
}

export interface ChemicalConstants {
  molarMass: string | null; // g/mol
  density: string | null; // g/mL
}

const E3 = rational(1n, 1000n);
const E6 = rational(1n, 1_000_000n);

/**
 * The requirement's measure per base unit of the container, or a reason it cannot be
 * converted (a missing molar mass, density or concentration). See the table above.
 */
export function perBaseUnit(measure: Measure, c: ContainerChemistry, chem: ChemicalConstants): { ok: true; value: Rational } | { ok: false; reason: string } {
  const need = (what: string) => ({ ok: false as const, reason: `needs the chemical's ${what}` });
  const M = chem.molarMass ? parseDecimal(chem.molarMass) : null;
  const rho = chem.density ? parseDecimal(chem.density) : null;
  const p = c.purityPercent ? div(parseDecimal(c.purityPercent), rational(100n)) : rational(1n);
  if (c.concentration && c.dimension === "volume") {
    const conc = parseDecimal(c.concentration);
    if (measure === "volume") return { ok: true, value: rational(1n) };
    if (c.concentrationUnit === "M") {
      if (measure === "mmol") return { ok: true, value: mul(conc, E6) };
      if (!M) return need("molar mass");
      return { ok: true, value: mul(mul(conc, M), E3) };
    }
    if (measure === "mass") return { ok: true, value: conc };
    if (!M) return need("molar mass");
    return { ok: true, value: div(mul(conc, E3), M) };
  }
  if (c.dimension === "mass") {
    if (measure === "mass") return { ok: true, value: rational(1n) };
    if (measure === "volume") return rho ? { ok: true, value: div(rational(1n), rho) } : need("density");
    return M ? { ok: true, value: div(mul(p, E3), M) } : need("molar mass");
  }
  if (measure === "volume") return { ok: true, value: rational(1n) };
  if (!rho) return need("density");
  if (measure === "mass") return { ok: true, value: rho };
  return M ? { ok: true, value: div(mul(mul(rho, p), E3), M) } : need("molar mass");
}

/** A requirement's amount in its measure: mmol as given, mass in µg, volume in nL (exact). */
export function requirementQuantity(value: string | number, unit: string): { measure: Measure; quantity: Rational } | null {
  const u = unit.trim().replace(/μ/g, "µ").toLowerCase();
  const v = parseDecimal(value);
  const table: Record<string, [Measure, Rational]> = {
    mmol: ["mmol", rational(1n)],
    mol: ["mmol", rational(1000n)],
    "µmol": ["mmol", E3],
    umol: ["mmol", E3],
    "µg": ["mass", rational(1n)],
    ug: ["mass", rational(1n)],
    mg: ["mass", rational(1000n)],
    g: ["mass", rational(1_000_000n)],
    kg: ["mass", rational(1_000_000_000n)],
    "µl": ["volume", rational(1000n)],
    ul: ["volume", rational(1000n)],
    ml: ["volume", rational(1_000_000n)],
    l: ["volume", rational(1_000_000_000n)],
  };
  const hit = table[u];
  return hit ? { measure: hit[0], quantity: mul(v, hit[1]) } : null;
}

/** Converts a quantity in `measure` (mmol, µg, nL) back to the requirement's unit. */
export function quantityInUnit(q: Rational, unit: string): Rational {
  const one = requirementQuantity(1, unit);
  if (!one) throw new RangeError(`unknown unit "${unit}"`);
  return div(q, one.quantity);
}
