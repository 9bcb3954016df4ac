/**
 * Plan content hashes: RFC 8785 canonical JSON (checked against the RFC's own examples)
 * hashed with SHA-256 (checked against the FIPS 180-4 / NIST test vector for "abc").
 */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { canonicalJson, contentHash } from "@/lib/plans/content-hash";
import { invalidPaths } from "../../support/invalid-paths";

describe("canonical JSON (RFC 8785)", () => {
  it("sorts keys and writes no whitespace (RFC 8785 §3.2.3 sorting example, abridged)", () => {
    // RFC 8785 §3.2.3: property names are sorted by their UTF-16 code units.
    const input = { "\u20ac": "Euro Sign", "\r": "Carriage Return", "\ufb33": "Hebrew Letter Dalet With Dagesh", "1": "One", "\ud83d\ude00": "Emoji: Grinning Face", "\u0080": "Control", "\u00f6": "Latin Small Letter O With Diaeresis" };
    // The RFC's expected output, property by property in that order.
    expect(canonicalJson(input)).toBe(
      '{"\\r":"Carriage Return","1":"One","\u0080":"Control","\u00f6":"Latin Small Letter O With Diaeresis","\u20ac":"Euro Sign","\ud83d\ude00":"Emoji: Grinning Face","\ufb33":"Hebrew Letter Dalet With Dagesh"}',
    );
  });

  it("writes numbers in the ECMAScript shortest form (RFC 8785 §3.2.2.3 and Appendix B examples)", () => {
    expect(canonicalJson({ numbers: [333333333.33333329, 1e30, 4.5, 2e-3, 0.000000000000000000000000001] })).toBe('{"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27]}');
    expect(canonicalJson([-0, 1e21, 1e-7])).toBe("[0,1e+21,1e-7]");
  });

  it("ignores key order and formatting of the same JSON", () => {
    expect(contentHash(JSON.parse('{ "b": [1, 2], "a": { "y": true, "x": null } }'))).toBe(contentHash({ a: { x: null, y: true }, b: [1, 2] }));
    expect(contentHash({ a: 1 })).not.toBe(contentHash({ a: 1.5 }));
  });

  it("names the path of what JSON cannot carry", () => {
    expect(invalidPaths(() => canonicalJson({ recipe: { components: [{ name: "ok" }, { name: "bad \ud800 surrogate" }] } }, "document"))).toEqual(["document.recipe.components.1.name"]);
    expect(invalidPaths(() => contentHash({ x: [1, Number.POSITIVE_INFINITY] }))).toEqual(["x.1"]);
  });
});

describe("SHA-256", () => {
  it("matches the FIPS 180-4 example for \"abc\" (NIST CSRC example values)", () => {
    // contentHash("abc") hashes the canonical JSON "\"abc\"" — check the digest primitive on "abc" itself.
    expect(createHash("sha256").update("abc").digest("hex")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(contentHash({})).toBe(createHash("sha256").update("{}").digest("hex"));
    expect(contentHash({})).toMatch(/^[0-9a-f]{64}$/);
  });
});
