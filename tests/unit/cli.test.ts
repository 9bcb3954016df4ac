import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";

// The command line's outer contract (the README): exit codes and the error shape.
function cli(args: string[], input: string) {
  const r = spawnSync("node_modules/.bin/tsx", ["lib/cli/main.ts", ...args], { input, encoding: "utf8" });
  return { status: r.status, body: JSON.parse(r.stdout) as { error?: { message: string; issues: { path: string }[] } } };
}

describe("engine command line", () => {
  it("rejects an unknown verb with exit 2 and an issue at path 'verb'", () => {
    const r = cli(["no-such-verb"], "{}");
    expect(r.status).toBe(2);
    expect(r.body.error?.issues[0]?.path).toBe("verb");
  });
  it("rejects input that is not JSON with exit 2", () => {
    const r = cli(["molar-mass"], "{not json");
    expect(r.status).toBe(2);
    expect(r.body.error?.message).toMatch(/not valid JSON/);
  });
});
