import { describe, expect, it } from "vitest";
import { changedFields } from "@/lib/client/changed-fields";

/** A partial PATCH sends only what changed (issue 9 item 7: a partial PATCH changes only the fields sent). Cases written by hand. */
describe("changedFields", () => {
  it("keeps only the keys whose values differ, lists and objects compared by value", () => {
    const before = { name: "THF", ghsStatements: ["H225"], lowStock: { amount: "500", unit: "mL" }, storageNotes: null as string | null, pyrophoric: false };
    const after = { name: "THF", ghsStatements: ["H225", "EUH019"], lowStock: { amount: "500", unit: "mL" }, storageNotes: "cabinet 3", pyrophoric: false };
    expect(changedFields(before, after)).toEqual({ ghsStatements: ["H225", "EUH019"], storageNotes: "cabinet 3" });
  });

  it("treats undefined and null alike, and returns nothing when nothing changed", () => {
    expect(changedFields({ cas: null as string | null | undefined }, { cas: undefined })).toEqual({});
    expect(changedFields({ a: 1 }, { a: 1 })).toEqual({});
  });
});
