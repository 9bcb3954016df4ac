import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

// The rule under test is the project's own eslint.config.mjs (house rule: engines import
// nothing from Next, React, Sequelize, pg, models or server code; DEVELOPERS.md). The
// fixtures are text files linted as if they stood inside each engine folder.
const root = fileURLToPath(new URL("../../../", import.meta.url));
const fixture = (name: string) => readFileSync(new URL(`./fixtures/${name}`, import.meta.url), "utf8");
const ENGINES = ["lib/doe", "lib/stats", "lib/surface", "lib/chemistry", "lib/hazards"];
const PURITY_RULES = new Set(["no-restricted-imports", "no-restricted-syntax"]);

async function lintAs(text: string, filePath: string) {
  const eslint = new ESLint({ cwd: root });
  const [result] = await eslint.lintText(text, { filePath: `${root}${filePath}` });
  return result!.messages;
}

describe("lint: the engines stay pure", () => {
  const impure = fixture("impure-engine.ts.txt");
  // Lines of the fixture that import something forbidden (counted from the fixture text).
  const forbiddenLines = impure
    .split("\n")
    .map((l, i) => ({ l, line: i + 1 }))
    .filter(({ l }) => /^(import|export \*|export type)/.test(l) || /await import\(/.test(l))
    .map(({ line }) => line);

  it.each(ENGINES)("flags every impure import of the fixture when it sits in %s", async (dir) => {
    const messages = await lintAs(impure, `${dir}/impure-fixture.ts`);
    const flagged = [...new Set(messages.filter((m) => PURITY_RULES.has(m.ruleId ?? "")).map((m) => m.line))].sort((a, b) => a - b);
    expect(forbiddenLines.length).toBe(15);
    expect(flagged).toEqual(forbiddenLines);
    expect(messages.every((m) => m.severity === 2 || !PURITY_RULES.has(m.ruleId ?? ""))).toBe(true);
  });

  it("lets the same text pass outside the engines (server code may use the database), except the global models rule", async () => {
    const messages = await lintAs(impure, "lib/members/impure-fixture.ts");
    const purity = messages.filter((m) => PURITY_RULES.has(m.ruleId ?? ""));
    // Only the project-wide rule "import models from @/lib/server/models" fires, on `@/models`.
    expect(purity.map((m) => m.line)).toEqual([8]);
  });

  it("leaves a domain's own server folder (lib/<domain>/server) to the server rules", async () => {
    const messages = await lintAs('import "server-only";\nimport { sequelize } from "@/lib/server/db";\nexport const s = sequelize;\n', "lib/chemistry/server/save-plan.ts");
    expect(messages.filter((m) => PURITY_RULES.has(m.ruleId ?? ""))).toEqual([]);
  });

  it("accepts a pure engine module: libraries, other engines, the pure inventory rules, import() of a library", async () => {
    const messages = await lintAs(fixture("pure-engine.ts.txt"), "lib/hazards/pure-fixture.ts");
    expect(messages.filter((m) => PURITY_RULES.has(m.ruleId ?? ""))).toEqual([]);
  });

  it("the real engines are clean", async () => {
    const eslint = new ESLint({ cwd: root });
    const results = await eslint.lintFiles(ENGINES);
    expect(results.length).toBeGreaterThan(40);
    const errors = results.flatMap((r) => r.messages.filter((m) => PURITY_RULES.has(m.ruleId ?? "")).map((m) => `${r.filePath}:${m.line} ${m.message}`));
    expect(errors).toEqual([]);
  }, 60_000);
});
