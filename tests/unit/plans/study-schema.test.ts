/**
 * Study schemas (lib/studies/schemas.ts): responses with a goal of maximize, minimize or a
 * target inside bounds (the three response goals of Derringer & Suich, "Simultaneous
 * optimization of several response variables", J. Qual. Technol. 12 (1980) 214), names
 * usable as keys and unique.
 */
import { describe, expect, it } from "vitest";
import { parseOrThrow } from "@/lib/errors/app-error";
import { studyCreateSchema, studyQuerySchema, studyUpdateSchema } from "@/lib/studies/schemas";
import { invalidPaths } from "../../support/invalid-paths";

const ok = { name: "Study A", goal: "maximise assay yield", responses: [{ name: "yield", unit: "%", goal: "maximize" }] };

describe("study schemas", () => {
  it("accepts a study with one response and clears empty optional text", () => {
    const v = parseOrThrow(studyCreateSchema, { ...ok, targetProduct: "  " });
    expect(v.targetProduct).toBeNull();
    expect(v.responses[0]).toEqual({ name: "yield", unit: "%", goal: "maximize" });
  });

  it("a target needs bounds that contain it", () => {
    const target = (r: Record<string, unknown>) => invalidPaths(() => parseOrThrow(studyCreateSchema, { ...ok, responses: [{ name: "purity", unit: "area %", goal: "target", ...r }] })).sort();
    expect(target({ target: 98 })).toEqual(["responses.0.high", "responses.0.low"]);
    expect(target({ target: 90, low: 95, high: 99 })).toEqual(["responses.0.target"]);
    expect(target({ target: 100, low: 95, high: 99 })).toEqual(["responses.0.target"]);
    expect(target({ target: 97, low: 99, high: 95 })).toEqual(["responses.0.high", "responses.0.target", "responses.0.target"]);
    expect(target({ goal: "maximize", target: 97 })).toEqual(["responses.0.target"]);
    expect(() => parseOrThrow(studyCreateSchema, { ...ok, responses: [{ name: "purity", goal: "target", target: 97, low: 95, high: 99 }] })).not.toThrow();
  });

  it("names are keys, unique ignoring case; at least one response", () => {
    const paths = invalidPaths(() =>
      parseOrThrow(studyCreateSchema, { name: "", responses: [{ name: "yield", goal: "maximize" }, { name: "Yield", goal: "minimize" }, { name: "2nd impurity", goal: "minimize" }] }),
    ).sort();
    expect(paths).toEqual(["name", "responses.1.name", "responses.2.name"]);
    expect(invalidPaths(() => parseOrThrow(studyCreateSchema, { name: "x", responses: [] }))).toEqual(["responses"]);
  });

  it("an update needs the version and changes only what it sends", () => {
    expect(invalidPaths(() => parseOrThrow(studyUpdateSchema, { name: "New" }))).toEqual(["version"]);
    expect(parseOrThrow(studyUpdateSchema, { version: 2, name: "New" })).toEqual({ version: 2, name: "New" });
  });

  it("the list query refuses an unknown sort", () => {
    expect(invalidPaths(() => parseOrThrow(studyQuerySchema, { sort: "author" }))).toEqual(["sort"]);
  });
});
