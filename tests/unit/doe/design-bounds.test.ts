import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { run as runDesign } from "../../../lib/cli/verbs/design";
import { AppError, errorBody } from "../../../lib/errors/app-error";
import { D_OPTIMAL_LIMITS, DESIGN_LIMITS, plannedRunCount, designInputSchema } from "../../../lib/doe";

// Issue 9: a D-optimal request with 30 factors exhausted memory and crashed the command line
// (no JSON, exit 134); 16 factors with 160 runs ran past a minute. Every design input beyond
// the bounds must be refused before any large work, with exit 2 and the field to change.

type Body = { error?: { message: string; issues: { path: string; message: string }[] } };

/** The design verb in process, mapped to exit codes as lib/cli/main.ts does. */
function designVerb(input: unknown): { status: number; body: Body } {
  try {
    return { status: 0, body: JSON.parse(JSON.stringify(runDesign(input))) as Body };
  } catch (e) {
    const code = e instanceof AppError ? e.code : "internal";
    const { error } = errorBody(e);
    return { status: code === "invalid_input" || code === "infeasible" ? 2 : 1, body: { error: { message: error.message, issues: error.issues } } };
  }
}

const factors = (k: number) => Array.from({ length: k }, (_, i) => ({ name: `f${i + 1}`, low: 0, high: 10 }));
const paths = (b: Body) => b.error!.issues.map((i) => i.path);

describe("design verb: oversized requests are refused with exit 2 naming the field", { timeout: 60_000 }, () => {
  it("30 factors, d-optimal, through the real command line: exit 2 and the JSON error", () => {
    const r = spawnSync("node_modules/.bin/tsx", ["lib/cli/main.ts", "design"], {
      input: JSON.stringify({ factors: factors(30), design: "d-optimal", runs: 60 }),
      encoding: "utf8",
      timeout: 50_000,
    });
    expect(r.status).toBe(2);
    const body = JSON.parse(r.stdout) as Body;
    expect(paths(body)).toEqual(["factors"]);
    expect(body.error!.issues[0]!.message).toMatch(/at most 25 factors/);
  });

  it.each([
    // [label, input, field, what the message must say]
    ["16 factors, quadratic, 160 runs", { factors: factors(16), design: "d-optimal", runs: 160 }, "factors", /16 factors give a quadratic model of 153 terms \(at most 120\)/],
    ["16 factors, linear", { factors: factors(16), design: "d-optimal", runs: 40, model: "linear" }, "factors", /candidate set of 65569 points .*use at most 14 factors/],
    ["14 factors, quadratic, 120 runs", { factors: factors(14), design: "d-optimal", runs: 120 }, "runs", /too much work for one exchange pass; use fewer runs, fewer candidates or a smaller model/],
    ["1000 runs from an 11-level grid", { factors: factors(4), design: "d-optimal", runs: 1000, levels: 11 }, "runs", /use fewer runs or fewer candidates/],
    ["1001 d-optimal runs", { factors: factors(3), design: "d-optimal", runs: 1001 }, "runs", /at most 1000 runs/],
    ["121 model terms", { factors: factors(3), design: "d-optimal", runs: 20, model: Array.from({ length: 121 }, (_, i) => `f1^${(i % 6) + 1}`) }, "model", /at most 120 terms/],
    ["20001 candidates", { factors: factors(2), design: "d-optimal", runs: 6, candidates: Array.from({ length: 20_001 }, (_, i) => ({ f1: i % 10, f2: 1 })) }, "candidates", /20000/],
    ["2^10 × 10 replicates", { factors: factors(10), design: "full-factorial", replicates: 10 }, "replicates", /10240 runs \(at most 10000\)/],
    ["CCD with 100 replicates of 1000 centre points", { factors: factors(10), design: "central-composite", replicates: 100, centerPoints: 1000 }, "replicates", /204400 runs/],
    ["Box–Behnken with 100 replicates", { factors: factors(7), design: "box-behnken", replicates: 100, centerPoints: 100 }, "replicates", /15600 runs/],
    ["64 blocks", { factors: factors(10), design: "full-factorial", blocks: 64 }, "blocks", /16/],
    ["51 constraints", { factors: factors(3), design: "d-optimal", runs: 12, constraints: Array.from({ length: 51 }, () => ({ expr: "f1 <= 9" })) }, "constraints", /50/],
    ["a 1000-character constraint", { factors: factors(2), design: "d-optimal", runs: 6, constraints: [{ expr: `f1 ${"+ f2 ".repeat(200)}<= 9` }] }, "constraints.0.expr", /500/],
  ])("%s: refused, naming the field", (_label, input, field, message) => {
    const r = designVerb(input);
    expect(r.status).toBe(2);
    expect(paths(r.body)).toContain(field);
    expect(r.body.error!.issues.find((i) => i.path === field)!.message).toMatch(message);
  });

  it("the largest accepted inputs stay within the bounds (computed here from the limits)", () => {
    // Run counts by hand: 2^10 × 9; (2^10 + 2·10 + 3 centre) × 9; (2^(6−2) + 4) × 2; Box–Behnken
    // k = 5 has 40 runs (Box & Behnken 1960) + 3 centre points.
    expect(plannedRunCount(designInputSchema.parse({ factors: factors(10), design: "full-factorial", replicates: 9 }))).toBe(9216);
    expect(plannedRunCount(designInputSchema.parse({ factors: factors(10), design: "central-composite", replicates: 9 }))).toBe((1024 + 20 + 3) * 9);
    expect(plannedRunCount(designInputSchema.parse({ factors: factors(6), design: "fractional-factorial", fraction: 2, centerPoints: 4, replicates: 2 }))).toBe((16 + 4) * 2);
    expect(plannedRunCount(designInputSchema.parse({ factors: factors(5), design: "box-behnken" }))).toBe(40 + 3);
    expect(DESIGN_LIMITS.runs).toBe(10_000);
    expect(D_OPTIMAL_LIMITS.candidates).toBe(20_000);
  });

  it("a request just inside the d-optimal bounds still runs and says whether the budget ended it", () => {
    // 14 factors, first-order model: the 2^14 = 16384-point two-level grid, 15 terms.
    const r = designVerb({ factors: factors(14), design: "d-optimal", runs: 16, model: "linear", starts: 1, tabuSteps: 50, randomize: false });
    expect(r.status).toBe(0);
    const out = r.body as unknown as { runs: unknown[]; dOptimal: { candidates: number; stoppedByBudget: boolean } };
    expect(out.runs).toHaveLength(16);
    expect(out.dOptimal.candidates).toBe(16384);
    expect(typeof out.dOptimal.stoppedByBudget).toBe("boolean");
  });
});
