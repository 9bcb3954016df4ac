/**
 * Units of factor values: each binding has one canonical unit, and a factor's `unit`
 * is converted to it with convert-units (temperature, time, rotation) or by the
 * definitions of the chemistry units (M, mM; mol %, ‰; fraction, vol %).
 */
import convert from "convert-units";
import { AppError } from "../errors/app-error";
import type { Binding } from "./plan-document";

/** The canonical unit of what each binding drives. */
export const CANONICAL_UNIT: Record<Binding["kind"], string> = {
  temperature: "degC",
  time: "h",
  stirring: "rpm",
  equivalents: "equiv",
  loading: "mol%",
  "ligand-ratio": "mol/mol",
  concentration: "M",
  "solvent-fraction": "fraction",
};

const TEMPERATURE: Record<string, convert.Unit> = { degC: "C", "°C": "C", C: "C", K: "K", degF: "F", "°F": "F", F: "F" };
const TIME: Record<string, convert.Unit> = { h: "h", hr: "h", hour: "h", hours: "h", min: "min", minutes: "min", s: "s", d: "d" };
const RATIOS: Record<Binding["kind"], Record<string, number>> = {
  temperature: {},
  time: {},
  stirring: {},
  equivalents: { equiv: 1, eq: 1, equivalents: 1, "mol/mol": 1, "": 1 },
  loading: { "mol%": 1, "mol %": 1, "%": 1, "": 1 },
  "ligand-ratio": { "mol/mol": 1, "L/M": 1, "L:M": 1, ratio: 1, equiv: 1, "": 1 },
  concentration: { M: 1, "mol/L": 1, mM: 1e-3, "mmol/L": 1e-3, "mmol/mL": 1 },
  "solvent-fraction": { fraction: 1, "v/v": 1, "": 1, "%": 0.01, "vol%": 0.01, "% v/v": 0.01 },
};

/**
 * Converts a factor's natural value in `unit` to the canonical unit of its binding
 * (°C, h, rpm, equiv, mol %, mol/mol, M, volume fraction).
 * @throws AppError("invalid_input") at `path` for a unit that does not fit the binding.
 */
export function toCanonical(kind: Binding["kind"], value: number, unit: string | undefined, path: string): number {
  const u = (unit ?? "").trim();
  if (kind === "temperature") {
    const from = TEMPERATURE[u === "" ? "degC" : u];
    if (!from) throw AppError.field(path, `unit "${u}" is not a temperature unit (use degC, K or degF)`);
    return from === "C" ? value : convert(value).from(from).to("C");
  }
  if (kind === "time") {
    const from = TIME[u === "" ? "h" : u];
    if (!from) throw AppError.field(path, `unit "${u}" is not a time unit (use h, min or s)`);
    return from === "h" ? value : convert(value).from(from).to("h");
  }
  if (kind === "stirring") {
    if (u === "" || u === "rpm") return value;
    if (u === "Hz") return convert(value).from("Hz").to("rpm");
    throw AppError.field(path, `unit "${u}" is not a stirring rate (use rpm)`);
  }
  const factor = RATIOS[kind][u];
  if (factor === undefined) {
    const allowed = Object.keys(RATIOS[kind]).filter((k) => k !== "").join(", ");
    throw AppError.field(path, `unit "${u}" does not fit a ${kind} factor (use ${allowed})`);
  }
  return value * factor;
}

/** Microlitres per millilitre, from convert-units (µL is mm³ there), read once: converting is on the hot path. */
const UL_PER_ML = convert(1).from("ml").to("mm3");

/** µL → mL (the factor from convert-units). */
export function ulToMl(ul: number): number {
  return ul / UL_PER_ML;
}
