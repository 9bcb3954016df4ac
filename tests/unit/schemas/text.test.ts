import { describe, expect, it } from "vitest";
import { optionalText, text, textProblem, toStorable } from "@/lib/schemas/text";

/**
 * Storable text. PostgreSQL documentation, "Character Types": "the character with code
 * zero (sometimes called NUL) cannot be stored"; "JSON Types": jsonb rejects \u0000 and
 * escapes that do not form a valid character. Unicode Standard §3.9 (D76, D91): a
 * surrogate code unit is well formed only as a high–low pair.
 */
describe("storable text", () => {
  it("finds NUL and lone surrogates, and accepts a proper pair", () => {
    expect(textProblem("a\u0000b")).toMatch(/NUL/);
    expect(textProblem("\uD800")).toMatch(/surrogate/);
    expect(textProblem("x\uDC00")).toMatch(/surrogate/);
    expect(textProblem("\uDC00\uD800")).toMatch(/surrogate/); // low before high is not a pair
    expect(textProblem("\uD83E\uDDEA")).toBeNull(); // U+1F9EA, a test tube
    expect(textProblem("Kestrel Bay — µL, °C, ±")).toBeNull();
  });

  it("text() trims, bounds and refuses what cannot be stored; optionalText() turns empty into null", () => {
    const name = text(5).min(1, "required");
    expect(name.parse("  abc  ")).toBe("abc");
    expect(name.safeParse("abcdef").success).toBe(false);
    expect(name.safeParse("ab\u0000").error?.issues[0]?.message).toMatch(/NUL/);
    expect(optionalText(10).parse("")).toBeNull();
    expect(optionalText(10).parse(null)).toBeNull();
  });

  it("toStorable replaces what cannot be stored (for names taken from uploaded files)", () => {
    expect(toStorable("sheet\u0000\uD800.pdf")).toBe("sheet__.pdf");
    expect(toStorable("\uD83E\uDDEA.pdf")).toBe("\uD83E\uDDEA.pdf");
  });
});
