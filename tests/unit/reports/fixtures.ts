/**
 * Plans for the report tests and the reports bench: the demo's Suzuki–Miyaura screen
 * (examples/plan-suzuki.json) and an invented 96-vial version of it in 1 mL crimp-cap
 * vials on one 96-position block per temperature (two set temperatures, 48 runs each;
 * the other factors at seeded pseudo-random levels inside their ranges).
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";

const root = fileURLToPath(new URL("../../../", import.meta.url));

export function suzukiDocument(): PlanDocumentInput {
  return JSON.parse(readFileSync(`${root}examples/plan-suzuki.json`, "utf8")) as PlanDocumentInput;
}

/** A deterministic sequence in [0, 1) (Park–Miller minimal standard generator). */
function uniform(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return s / 2147483647;
  };
}

/** The Suzuki screen as 96 runs in 1 mL vials: temperatures 60 and 80 °C, run order a fixed permutation. */
export function plan96Document(): PlanDocumentInput {
  const doc = suzukiDocument();
  const rnd = uniform(2026);
  const range = (lo: number, hi: number) => lo + (hi - lo) * rnd();
  const runs = Array.from({ length: 96 }, (_, i) => ({
    standardOrder: i + 1,
    runOrder: ((i * 37) % 96) + 1,
    kind: "optimal",
    natural: {
      temperature: i % 2 === 0 ? 60 : 80,
      baseEquiv: range(1.5, 3),
      boronicEquiv: range(1.1, 1.5),
      pdLoading: range(0.5, 2),
      waterFraction: range(0.1, 0.3),
    },
  }));
  return {
    ...doc,
    name: "Invented 96-vial Suzuki–Miyaura screen (1 mL vials)",
    recipe: { ...doc.recipe, scaleMmol: 0.05, concentrationM: 0.2 },
    design: { runs },
    vessel: {
      id: "test-vial-1ml-crimp",
      name: "1 mL crimp-cap vial (96-position block)",
      totalVolumeMl: 1,
      workingMinMl: 0.1,
      workingMaxMl: 0.3,
      ratedBar: 10,
      maxFillFraction: 0.6,
      sealed: true,
      confirmWithSupplier: false,
      source: "Invented test values; not a maker's rating.",
    },
  };
}
