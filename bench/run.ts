/**
 * `npm run bench`: runs every `bench/*.bench.ts` (each exports `cases`, timed runs, or
 * `measuredCases` that measure themselves, such as the HTTP load test of bench/http.bench.ts
 * against the running app) and prints one line per case (and any notes a case adds, e.g. the
 * analysis bench's comparison with statsmodels). Pass a substring to run only matching cases.
 */
import { readdirSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { join } from "node:path";
import { runCase, runCaseAsync, type AsyncBenchCase, type BenchCase, type MeasuredBenchCase } from "./harness";

const dir = fileURLToPath(new URL(".", import.meta.url));
const filter = process.argv[2] ?? "";
const files = readdirSync(dir).filter((f) => f.endsWith(".bench.ts")).sort();

console.log(`Tareline benchmarks on ${process.version}, ${new Date().toISOString()}`);
console.log("case | median ms | min–max ms | target ms | runs | verdict");
for (const file of files) {
  const mod = (await import(pathToFileURL(join(dir, file)).href)) as { cases?: Array<BenchCase | AsyncBenchCase>; measuredCases?: MeasuredBenchCase[] };
  for (const c of mod.measuredCases ?? []) {
    if (filter && !c.name.includes(filter)) continue;
    const r = await c.measure();
    console.log(`${c.name} | ${r.valueMs.toFixed(2)} | ${r.detail} | ${c.targetMs} | — | ${r.valueMs <= c.targetMs ? "meets target" : "OVER TARGET"}`);
    for (const line of r.notes) console.log(`  ↳ ${line}`);
  }
  for (const c of mod.cases ?? []) {
    if (filter && !c.name.includes(filter)) continue;
    const r = "runAsync" in c ? await runCaseAsync(c) : runCase(c);
    const verdict = r.medianMs <= r.targetMs ? "meets target" : "OVER TARGET";
    console.log(
      `${r.name} | ${r.medianMs.toFixed(2)} | ${r.minMs.toFixed(2)}–${r.maxMs.toFixed(2)} | ${r.targetMs} | ${r.repeat} | ${verdict}`,
    );
    for (const line of r.notes) console.log(`  ↳ ${line}`);
  }
}
