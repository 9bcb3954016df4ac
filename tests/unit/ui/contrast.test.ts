import { describe, expect, it } from "vitest";
import config from "@/tailwind.config";

/**
 * Text colours of the theme against the paper backgrounds meet WCAG 2.2 AA (success
 * criterion 1.4.3: 4.5:1 for normal text) and input edges 3:1 (1.4.11 non-text contrast).
 * Contrast ratio and relative luminance as defined in WCAG 2.2 ("contrast ratio",
 * "relative luminance", sRGB linearisation with the 0.04045 threshold).
 */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

type Palette = Record<string, Record<string, string>>;
const colors = (config.theme?.extend?.colors ?? {}) as Palette;
const c = (name: string, shade = "DEFAULT") => {
  const v = colors[name]?.[shade];
  if (!v) throw new Error(`no colour ${name}.${shade}`);
  return v;
};

describe("WCAG contrast of the theme", () => {
  it("computes the WCAG ratio (black on white is 21:1, by definition; white on white 1:1)", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 10);
    expect(contrast("#ffffff", "#ffffff")).toBe(1);
    // #767676 on white is the lightest grey that passes AA (common practice, from memory: 4.54:1).
    expect(contrast("#767676", "#ffffff")).toBeCloseTo(4.54, 2);
  });

  const papers = [c("paper"), c("paper", "deep"), c("paper", "card")];
  const texts: Array<[string, string]> = [
    ["ink", c("ink")],
    ["ink.soft", c("ink", "soft")],
    ["ink.faint", c("ink", "faint")],
    ["accent (links)", c("accent")],
    ["accent.dark", c("accent", "dark")],
    ["ok", c("ok")],
    ["caution", c("caution")],
    ["blocks", c("blocks")],
  ];
  for (const [name, fg] of texts) {
    it(`${name} text is at least 4.5:1 on every paper`, () => {
      for (const bg of papers) expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
    });
  }

  it("button text on the accent, severity text on its own background, active nav text on accent.light", () => {
    expect(contrast(c("paper", "card"), c("accent"))).toBeGreaterThanOrEqual(4.5);
    expect(contrast(c("paper", "card"), c("accent", "dark"))).toBeGreaterThanOrEqual(4.5);
    for (const tone of ["ok", "caution", "blocks"]) expect(contrast(c(tone), c(tone, "bg"))).toBeGreaterThanOrEqual(4.5);
    expect(contrast(c("accent", "dark"), c("accent", "light"))).toBeGreaterThanOrEqual(4.5);
  });

  it("input edges are at least 3:1 against paper and card", () => {
    expect(contrast(c("ink", "edge"), c("paper"))).toBeGreaterThanOrEqual(3);
    expect(contrast(c("ink", "edge"), c("paper", "card"))).toBeGreaterThanOrEqual(3);
  });

  it("the accent is not the wordmark's copper: a blue, far from it", () => {
    const hue = (hex: string) => {
      const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255) as [number, number, number];
      const max = Math.max(r, g, b), min = Math.min(r, g, b), d = max - min;
      const h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4;
      return (h * 60 + 360) % 360;
    };
    // Copper #a8592e (components/shell/wordmark.tsx) has a hue near 22°; a slate blue sits near 210–220°.
    expect(hue("#a8592e")).toBeCloseTo(21.6, 0);
    expect(hue(c("accent"))).toBeGreaterThan(200);
    expect(hue(c("accent"))).toBeLessThan(230);
    expect(JSON.stringify(colors)).not.toMatch(/a8592e/i);
  });
});
