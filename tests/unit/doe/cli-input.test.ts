import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { AppError, errorBody } from "../../../lib/errors/app-error";
import { run as runDesign } from "../../../lib/cli/verbs/design";
import { run as runFit } from "../../../lib/cli/verbs/fit";
import { run as runOptimize } from "../../../lib/cli/verbs/optimize";

// CONTRACT.md: exit 2 for invalid input with {"error":{"message","issues":[{path,message}]}}.
type Body = { error?: { message: string; issues: { path: string; message: string }[] } } & Record<string, unknown>;
function spawnCli(verb: string, input: unknown) {
  const r = spawnSync("node_modules/.bin/tsx", ["lib/cli/main.ts", verb], { input: JSON.stringify(input), encoding: "utf8" });
  return { status: r.status, body: JSON.parse(r.stdout) as Body };
}

// Every bad field is checked through the verb module the CLI loads, in process (the CLI
// maps invalid_input and infeasible to exit 2 and prints errorBody); one case of each verb,
// and the good input, also go through the real command line with spawnSync, because
// starting tsx costs about a second per call.
const VERB_RUN: Record<string, (input: unknown) => unknown> = { design: runDesign, fit: runFit, optimize: runOptimize };
const SPAWNED = new Set<string>();
function cli(verb: string, input: unknown, viaProcess = false) {
  if (viaProcess) return spawnCli(verb, input);
  if (!SPAWNED.has(verb)) {
    SPAWNED.add(verb); // the first bad input of each verb goes through the real process
    return spawnCli(verb, input);
  }
  try {
    return { status: 0, body: JSON.parse(JSON.stringify(VERB_RUN[verb]!(input))) as Body };
  } catch (e) {
    const body = errorBody(e);
    const code = e instanceof AppError ? e.code : "internal";
    return { status: code === "invalid_input" || code === "infeasible" ? 2 : 1, body: { error: { message: body.error.message, issues: body.error.issues } } as Body };
  }
}

const factors = [
  { name: "temperature", low: 70, high: 110, unit: "degC" },
  { name: "time", low: 1, high: 4, unit: "h" },
];
const runs = [
  [-1, -1, 60], [1, -1, 70], [-1, 1, 65], [1, 1, 80], [0, 0, 75], [0, 0, 74], [0, 0, 76],
].map(([a, b, y]) => ({ coded: { temperature: a, time: b }, response: y }));

describe("design verb: bad input", { timeout: 30_000 }, () => {
  const good = { factors, design: "full-factorial", seed: 1 };
  it("accepts a good input with exit 0", () => {
    const r = cli("design", good, true);
    expect(r.status).toBe(0);
    expect((r.body.runs as unknown[]).length).toBe(4);
  });
  it.each([
    [{ ...good, factors: [{ ...factors[0], low: 120 }, factors[1]] }, "factors.0.high"],
    [{ ...good, factors: [{ ...factors[0], low: "cold" }, factors[1]] }, "factors.0.low"],
    [{ ...good, factors: [factors[0], { ...factors[1], name: "temperature" }] }, "factors.1.name"],
    [{ ...good, factors: [factors[0], { ...factors[1], name: "time h" }] }, "factors.1.name"],
    [{ ...good, factors: [] }, "factors"],
    [{ ...good, design: "latin-square" }, "design"],
    [{ ...good, alpha: -1 }, "alpha"],
    [{ ...good, placement: "outside" }, "placement"],
    [{ ...good, centerPoints: -2 }, "centerPoints"],
    [{ ...good, replicates: 0 }, "replicates"],
    [{ ...good, randomize: "yes" }, "randomize"],
    [{ ...good, seed: 1.5 }, "seed"],
    [{ ...good, blocks: 3 }, "blocks"],
    [{ ...good, hardToChange: "pressure" }, "hardToChange"],
    [{ ...good, design: "d-optimal" }, "runs"],
    [{ ...good, design: "d-optimal", runs: 8, model: ["temperature*pressure"] }, "model.0"],
    [{ ...good, design: "d-optimal", runs: 8, constraints: [{ expr: "temperature * time <= 5" }] }, "constraints.0.expr"],
    [{ ...good, design: "fractional-factorial", factors: [...factors, { name: "c", low: 0, high: 1 }], generators: ["C=AZ"] }, "generators.0"],
    [{ ...good, design: "box-behnken" }, "factors"],
  ])("input %# gives exit 2 naming %s", (input, path) => {
    const r = cli("design", input);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues.map((i) => i.path)).toContain(path);
  });
});

describe("fit verb: bad input", { timeout: 30_000 }, () => {
  const good = { factors, runs, model: "interaction" };
  it("accepts a good input with exit 0", () => {
    const r = cli("fit", good, true);
    expect(r.status).toBe(0);
    expect((r.body.terms as { term: string }[])[0]!.term).toBe("intercept");
  });
  it.each([
    [{ ...good, runs: [] }, "runs"],
    [{ ...good, runs: [{ coded: { temperature: 0 }, response: 1 }, ...runs] }, "runs.0.coded.time"],
    [{ ...good, runs: [{ coded: { temperature: 0, time: 0, speed: 1 }, response: 1 }, ...runs] }, "runs.0.coded.speed"],
    [{ ...good, runs: [{ coded: { temperature: 0, time: 0 } }, ...runs] }, "runs.0.response"],
    [{ ...good, runs: [{ coded: { temperature: 0, time: 0 }, response: "high" }, ...runs] }, "runs.0.response"],
    [{ ...good, runs: [{ response: 3 }, ...runs] }, "runs.0"],
    [{ ...good, model: "cubic" }, "model"],
    [{ ...good, model: ["temperature^"] }, "model.0"],
    [{ ...good, transform: "sqrt" }, "transform"],
    [{ ...good, transform: "ln", runs: [{ coded: { temperature: 0, time: 0 }, response: -1 }, ...runs] }, "runs.0.response"],
    [{ ...good, prune: { alpha: 2 } }, "prune.alpha"],
    [{ ...good, model: "quadratic", runs: runs.slice(0, 4) }, "runs"],
  ])("input %# gives exit 2 naming %s", (input, path) => {
    const r = cli("fit", input);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues.map((i) => i.path)).toContain(path);
  });
});

describe("optimize verb: bad input", { timeout: 30_000 }, () => {
  const good = { factors, runs, model: "interaction", goal: "maximize", region: "cube" };
  it("accepts a good input with exit 0", () => {
    const r = cli("optimize", good, true);
    expect(r.status).toBe(0);
    expect(typeof r.body.predicted).toBe("number");
  });
  it.each([
    [{ ...good, goal: "best" }, "goal"],
    [{ ...good, region: "ball" }, "region"],
    [{ ...good, radius: -1 }, "radius"],
    [{ ...good, constraints: [{ expr: "temperature <=" }] }, "constraints.0.expr"],
    [{ ...good, constraints: [{ expr: "pressure <= 3" }] }, "constraints.0.expr"],
    [{ ...good, responses: [{ name: "yield", goal: "maximize", low: 90, high: 60 }] }, "responses.0.high"],
    [{ ...good, responses: [{ name: "ee", goal: "target", low: 80, high: 100 }] }, "responses.0.target"],
    [{ ...good, responses: [{ name: "impurity", goal: "minimize", low: 0, high: 2 }] }, "runs.0.response"],
  ])("input %# gives exit 2 naming %s", (input, path) => {
    const r = cli("optimize", input);
    expect(r.status).toBe(2);
    expect(r.body.error!.issues.map((i) => i.path)).toContain(path);
  });
  it("constraints that leave nothing feasible give exit 2 (infeasible)", () => {
    const r = cli("optimize", { ...good, constraints: [{ expr: "temperature <= 50" }] }, true);
    expect(r.status).toBe(2);
  });
});
