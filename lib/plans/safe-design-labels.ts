/**
 * What the safe-design panel shows in the browser, apart from the engines: the names of
 * the alternatives, which of them are the quick ones (asked for first; the D-optimal search
 * is asked for on its own), and how a factor's unit is written next to a number. No engine
 * code here, so the panel's bundle stays small.
 */
import type { AlternativeKind } from "../doe/safe-alternatives";

/** The alternatives' names on screen, in the order they are shown. */
export const ALTERNATIVE_LABELS: Record<AlternativeKind, string> = {
  "face-centered": "Face-centred",
  inscribed: "Inscribed",
  "smaller-alpha": "Smaller α",
  "narrower-range": "Narrower range",
  "d-optimal": "D-optimal without the blocked points",
};

/** The quick alternatives (well under a second for six factors): every kind but "d-optimal" (a unit test holds this to ALTERNATIVE_KINDS). */
export const QUICK_ALTERNATIVES: readonly AlternativeKind[] = ["face-centered", "inscribed", "smaller-alpha", "narrower-range"];

/** A factor's unit as it is written next to a number ("°C", "mol %"; nothing for a fraction): the one table. */
export { displayUnit as unitLabel } from "../units/display-unit";
