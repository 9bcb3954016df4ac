/**
 * Benchmarks of the design and analysis engine (issue 3): the four cases and targets
 * of the issue, on this 2-core machine.
 */
import type { BenchCase } from "./harness";
import { generateDesign, seededRng } from "../lib/doe";
import { fitModel } from "../lib/stats";

const six = Array.from({ length: 6 }, (_, i) => ({ name: `x${i + 1}`, low: 0, high: 10 }));
const four = six.slice(0, 4);

/** A quadratic with some inactive terms, plus seeded noise. */
function response(x: readonly number[], rng: () => number): number {
  const [a = 0, b = 0, c = 0, d = 0, e = 0, f = 0] = x;
  return 60 + 4 * a - 3 * b + 2 * c + 0.5 * d + 1.5 * a * b - 2 * a * a - b * b - 0.8 * e * e + 0.3 * f + (rng() - 0.5);
}

export const cases: BenchCase[] = [
  {
    name: "doe (a): fit 6-factor full quadratic (28 terms), backward elimination, 1536 runs",
    targetMs: 150,
    repeat: 15,
    setup: () => {
      const rng = seededRng(1536);
      const runs = Array.from({ length: 1536 }, () => {
        const coded = Object.fromEntries(six.map((f) => [f.name, 2 * rng() - 1]));
        return { coded, response: response(Object.values(coded), rng) };
      });
      return { factors: six, runs, model: "quadratic", prune: { alpha: 0.05, hierarchy: true } };
    },
    run: (input) => fitModel(input),
  },
  {
    name: "doe (b): design + fit 4-factor face-centred CCD, 6 centre points",
    targetMs: 5,
    repeat: 50,
    warmup: 10,
    run: () => {
      const d = generateDesign({ factors: four, design: "central-composite", alpha: "face-centered", centerPoints: 6, seed: 4 });
      const rng = seededRng(4);
      const runs = d.runs.map((r) => ({ coded: r.coded, response: response(Object.values(r.coded), rng) }));
      return fitModel({ factors: four, runs, model: "quadratic" });
    },
  },
  {
    name: "doe (c): D-optimal 6-factor quadratic, 40 runs from the 3^6 = 729-point grid",
    targetMs: 2000,
    repeat: 5,
    warmup: 1,
    run: () => generateDesign({ factors: six, design: "d-optimal", runs: 40, model: "quadratic", levels: 3, seed: 6 }),
  },
  {
    name: "doe (d): 2^(10−3) fractional factorial with alias structure",
    targetMs: 50,
    repeat: 30,
    run: () => generateDesign({ factors: Array.from({ length: 10 }, (_, i) => ({ name: `f${i}`, low: 0, high: 1 })), design: "fractional-factorial", fraction: 3, seed: 10 }),
  },
];
