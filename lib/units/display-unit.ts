/**
 * Units as people read them next to a number ("degC" → "°C", "mol%" → "mol %", "uL" → "µL";
 * a fraction has none). The one table of display units: documents, engines' messages, pages
 * and sheets all write units through it. Pure, no imports (pages load it).
 */
const DISPLAY_UNITS: Record<string, string> = {
  degC: "°C",
  C: "°C",
  degF: "°F",
  "mol%": "mol %",
  "vol%": "vol %",
  uL: "µL",
  ul: "µL",
  fraction: "",
};

/** A unit as written next to a number; unknown units unchanged, none as "". */
export function displayUnit(unit: string | undefined | null): string {
  if (!unit) return "";
  return DISPLAY_UNITS[unit] ?? unit;
}

