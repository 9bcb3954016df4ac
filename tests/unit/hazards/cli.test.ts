import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";

// The command line contract (README: "vapor-pressure", "vessel-pressure"):
// exit 0 with the documented fields; exit 2 with {"error":{message, issues:[{path}]}}.
interface Body {
  error?: { message: string; issues: { path: string; message: string }[] };
  [k: string]: unknown;
}
function cli(verb: string, input: unknown) {
  const r = spawnSync("node_modules/.bin/tsx", ["lib/cli/main.ts", verb], { input: JSON.stringify(input), encoding: "utf8" });
  return { status: r.status, body: JSON.parse(r.stdout) as Body };
}

describe("vapor-pressure verb", () => {
  it("answers THF at 120 °C with 4.437 bar by DIPPR-101 (computed from Perry's 8th ed. Table 2-8)", () => {
    const r = cli("vapor-pressure", { solvent: "tetrahydrofuran", temperatureC: 120 });
    expect(r.status).toBe(0);
    expect(Math.abs((r.body.bar as number) - 4.437)).toBeLessThan(5e-4);
    expect(r.body.method).toBe("DIPPR-101");
    expect(r.body.inRange).toBe(true);
    expect(typeof r.body.source).toBe("string");
  });
  it("accepts a CAS number", () => {
    const r = cli("vapor-pressure", { solvent: "7732-18-5", temperatureC: 100 });
    expect(r.status).toBe(0);
    expect(Math.abs((r.body.bar as number) - 1.01418)).toBeLessThan(5e-6); // IAPWS R7-97(2012) eq. 30, computed [C]
    expect(r.body.method).toBe("IAPWS-IF97");
  });
  it("an unknown solvent exits 2 with path solvent", () => {
    const r = cli("vapor-pressure", { solvent: "unobtainium", temperatureC: 50 });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toEqual(["solvent"]);
  });
  it("an invalid lab solvent record exits 2 with the field's path", () => {
    const r = cli("vapor-pressure", { solvent: "x", temperatureC: 50, labSolvents: [{ id: "x", name: "x" }] });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toContain("labSolvents.0.densityGPerMl");
  });
  it("−300 °C exits 2 with path temperatureC", () => {
    const r = cli("vapor-pressure", { solvent: "toluene", temperatureC: -300 });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toEqual(["temperatureC"]);
  });
});

describe("vessel-pressure verb", () => {
  const input = {
    solvents: [
      { name: "1,4-dioxane", volumeFraction: 0.8 },
      { name: "water", volumeFraction: 0.2 },
    ],
    temperatureC: 110,
    sealTemperatureC: 25,
    sealPressureBar: 1.01325,
    vesselVolumeMl: 4,
    liquidVolumeMl: 2,
    gasReleasedMmol: 0,
    ratedBar: 3,
  };
  it("returns the contract's fields, the parts adding up (computed in this test), and the notice", () => {
    const r = cli("vessel-pressure", input);
    expect(r.status).toBe(0);
    const b = r.body as Record<string, number>;
    for (const k of ["totalBar", "vaporBar", "airBar", "gasBar", "fillFractionHot"]) expect(typeof b[k], k).toBe("number");
    expect(Math.abs(b.totalBar! - (b.vaporBar! + b.airBar! + b.gasBar!))).toBeLessThan(1e-12);
    expect(Array.isArray(r.body.cautions)).toBe(true);
    expect(r.body.notice).toMatch(/not a risk assessment/);
  });
  it("volume fractions not summing to 1 exit 2 with path solvents", () => {
    const r = cli("vessel-pressure", { ...input, solvents: [{ name: "toluene", volumeFraction: 0.9 }] });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toEqual(["solvents"]);
  });
  it("an unknown solvent exits 2 with path solvents.1.name", () => {
    const r = cli("vessel-pressure", { ...input, solvents: [{ name: "toluene", volumeFraction: 0.5 }, { name: "unobtainium", volumeFraction: 0.5 }] });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toEqual(["solvents.1.name"]);
  });
  it("−300 °C exits 2 with path temperatureC", () => {
    const r = cli("vessel-pressure", { ...input, temperatureC: -300 });
    expect(r.status).toBe(2);
    expect(r.body.error?.issues.map((i) => i.path)).toEqual(["temperatureC"]);
  });
});
