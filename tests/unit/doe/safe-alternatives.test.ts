import { describe, expect, it } from "vitest";
import { generateDesign, safeDesignAlternatives, seededRng, type DesignAlternative, type PointVerdict } from "../../../lib/doe";

const factors = [
  { name: "temperatureC", low: 60, high: 120, unit: "degC" },
  { name: "timeH", low: 1, high: 8, unit: "h" },
  { name: "equiv", low: 1, high: 2 },
];
/** An invented vial rating: nothing above 125 °C (for the test only). */
const hot: PointVerdict = (x) => (x.temperatureC! > 125 ? `${x.temperatureC} °C is above the vial's rating` : false);
const ccd = { factors, design: "central-composite", alpha: "rotatable", centerPoints: 3, seed: 7 } as const;
const rotatable = Math.pow(8, 0.25); // α = F^(1/4), F = 2³ (NIST/SEMATECH e-Handbook §5.3.3.6.1)

function byKind(list: readonly DesignAlternative[], kind: DesignAlternative["kind"]) {
  const a = list.find((x) => x.kind === kind);
  if (!a || !a.available) throw new Error(`${kind} is not available`);
  return a;
}

describe("safe-design alternatives of a rotatable CCD whose +α temperature run is blocked", () => {
  const res = safeDesignAlternatives(ccd, hot);

  it("names the blocked run of the original design", () => {
    // +α on temperature: 90 + 1.68179·30 = 140.45 °C > 125 °C; it is run 10 in standard order
    // (8 factorial runs, then −α, +α on the first factor).
    expect(res.original.blockedRuns.map((r) => r.standardOrder)).toEqual([10]);
    expect(res.original.blockedRuns[0]!.natural.temperatureC).toBeCloseTo(90 + rotatable * 30, 9);
    expect(res.original.blockedRuns[0]!.reason).toMatch(/vial's rating/);
    expect(res.original.dEfficiency).toBeCloseTo(1, 12);
  });

  it("offers the five alternatives side by side, each with its run count", () => {
    expect(res.alternatives.map((a) => a.kind)).toEqual(["face-centered", "inscribed", "smaller-alpha", "narrower-range", "d-optimal"]);
    for (const a of res.alternatives) {
      expect(a.available).toBe(true);
      if (a.available) {
        expect(a.runCount).toBe(17);
        expect(a.nothingBlocks).toBe(true);
      }
    }
  });

  it("the smaller α is the largest that keeps the +α run at or below 125 °C (by hand)", () => {
    // 90 + α·30 ≤ 125 → α ≤ 35/30 = 1.16667, rounded down to 4 decimals.
    const a = byKind(res.alternatives, "smaller-alpha");
    expect(a.design.alpha).toBeCloseTo(1.1666, 12);
  });

  it("the narrower range lowers the temperature's high limit until the +α run is at 125 °C (by hand)", () => {
    // New high h: centre (60 + h)/2, half-range (h − 60)/2, +α run (60 + h)/2 + α(h − 60)/2 ≤ 125
    // → h ≤ (250 − 60 + 60α)/(1 + α) = 108.4749…, rounded inward to 0.01 → 108.47.
    const a = byKind(res.alternatives, "narrower-range");
    const h = (250 - 60 + 60 * rotatable) / (1 + rotatable);
    expect(a.changedFactors).toHaveLength(1);
    expect(a.changedFactors[0]!.name).toBe("temperatureC");
    expect(a.changedFactors[0]!.low).toBe(60);
    expect(a.changedFactors[0]!.high).toBe(Math.floor(h * 100) / 100);
  });

  it("the inscribed design's D-efficiency is α^−3 for the quadratic in 3 factors (by hand)", () => {
    // Inscribed = circumscribed scaled by 1/α in coded units. For the 10-term quadratic the
    // 3 linear columns scale by 1/α and the 3 interaction and 3 square columns by 1/α², so
    // |X'X| scales by α^−(2·3 + 4·6) = α^−30 and the efficiency is (α^−30)^(1/10) = α^−3.
    expect(byKind(res.alternatives, "inscribed").dEfficiency).toBeCloseTo(Math.pow(rotatable, -3), 9);
  });

  it("the D-optimal alternative never uses the blocked point and keeps the centre runs", () => {
    const a = byKind(res.alternatives, "d-optimal");
    expect(a.design.runs.every((r) => r.natural.temperatureC! <= 125)).toBe(true);
    expect(a.design.runs.filter((r) => Object.values(r.coded).every((v) => v === 0)).length).toBeGreaterThanOrEqual(3);
    expect(a.dEfficiency).toBeGreaterThan(0.8);
  });

  it("the alternatives that do not apply say why", () => {
    const bb = safeDesignAlternatives({ factors, design: "box-behnken", seed: 1 }, hot);
    const fc = bb.alternatives.find((a) => a.kind === "face-centered")!;
    expect(fc.available).toBe(false);
    expect(fc.summary).toMatch(/central composite/);
    // Box–Behnken runs stay within the box: nothing blocks, so no range needs narrowing.
    expect(bb.original.nothingBlocks).toBe(true);
    expect(bb.alternatives.find((a) => a.kind === "narrower-range")!.available).toBe(false);
  });
});

describe("property: no applied alternative that claims nothing blocks contains a blocked run", () => {
  it("over random factor boxes, blocked regions and designs", { timeout: 240_000 }, () => {
    const rng = seededRng("safe-alternatives-property");
    let claimed = 0;
    let rescued = 0;
    for (let trial = 0; trial < 30; trial++) {
      const k = 2 + Math.floor(rng() * 3);
      const box = Array.from({ length: k }, (_, i) => {
        const low = Math.round(rng() * 200) - 50;
        return { name: `f${i}`, low, high: low + 5 + Math.round(rng() * 100) };
      });
      const unit = (x: Readonly<Record<string, number>>, i: number) => (x[box[i]!.name]! - box[i]!.low) / (box[i]!.high - box[i]!.low);
      // A random blocked region in natural units: a half-space, a ball or a corner box.
      const shape = Math.floor(rng() * 3);
      const a = box.map(() => rng() * 2 - 1);
      const c = box.map(() => rng() * 1.6 - 0.3);
      const r = 0.15 + rng() * 0.5;
      const t = 0.4 + rng() * 0.6;
      const blocked: PointVerdict = (x) => {
        if (shape === 0) return box.reduce((s, _, i) => s + a[i]! * (unit(x, i) - 0.5), 0) > t * 0.6 ? "half-space" : false;
        if (shape === 1) return Math.hypot(...box.map((_, i) => unit(x, i) - c[i]!)) < r ? "ball" : false;
        return box.every((_, i) => (a[i]! > 0 ? unit(x, i) > 1 - r : unit(x, i) < r)) ? "corner" : false;
      };
      const kind = rng();
      const input =
        kind < 0.6
          ? { factors: box, design: "central-composite", alpha: rng() < 0.7 ? "rotatable" : "spherical", seed: trial }
          : kind < 0.8 && k >= 3
            ? { factors: box, design: "box-behnken", seed: trial }
            : { factors: box, design: "full-factorial", centerPoints: 2, seed: trial };
      const res = safeDesignAlternatives(input, blocked);
      if (!res.original.nothingBlocks) rescued += res.alternatives.filter((x) => x.available && x.nothingBlocks).length;
      for (const alt of [res.original, ...res.alternatives]) {
        if (!("input" in alt)) continue;
        // The judged runs are exactly the blocked ones…
        for (const run of alt.design.runs) {
          const isBlocked = blocked(run.natural) !== false;
          expect(alt.blockedRuns.some((b) => b.standardOrder === run.standardOrder)).toBe(isBlocked);
        }
        if (!alt.nothingBlocks) continue;
        // …and applying the alternative (generating its input again) gives no blocked run.
        claimed++;
        const applied = generateDesign(alt.input);
        expect(applied.runs.map((x) => x.natural)).toEqual(alt.design.runs.map((x) => x.natural));
        for (const run of applied.runs) expect(blocked(run.natural)).toBe(false);
      }
    }
    expect(claimed).toBeGreaterThan(30); // the property was exercised…
    expect(rescued).toBeGreaterThan(15); // …also on designs whose original runs were blocked
  });
});
