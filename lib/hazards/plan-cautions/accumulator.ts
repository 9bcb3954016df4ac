/**
 * Merges the firings of many runs into one caution per rule and component, listing every
 * run it touches; the message is the worst case's (highest score).
 */
import { CAUTION_RULES, compareCautions, type Caution, type CautionCode, type Severity } from "../caution-rules";
import type { Firing } from "../run-checks";

interface Entry {
  code: CautionCode;
  severity: Severity;
  component?: string;
  runs: number[];
  worstScore: number;
  leastScore: number;
  worstRun: number;
  message: () => string;
}

export class CautionAccumulator {
  private readonly entries = new Map<string, Map<string, Entry>>();
  /** The run that `push` files firings under. */
  current = 0;

  push(f: Firing): void {
    this.add(this.current, f);
  }

  add(run: number, f: Firing): void {
    let byComponent = this.entries.get(f.code);
    if (!byComponent) {
      byComponent = new Map();
      this.entries.set(f.code, byComponent);
    }
    const component = f.component ?? "";
    const e = byComponent.get(component);
    if (!e) {
      byComponent.set(component, {
        code: f.code,
        severity: f.severity,
        ...(f.component ? { component: f.component } : {}),
        runs: [run],
        worstScore: f.score,
        leastScore: f.score,
        worstRun: run,
        message: f.message,
      });
      return;
    }
    if (e.runs[e.runs.length - 1] !== run) e.runs.push(run);
    if (f.score < e.leastScore) e.leastScore = f.score;
    if (f.score > e.worstScore) {
      e.worstScore = f.score;
      e.worstRun = run;
      e.message = f.message;
    }
    if (f.severity === "blocking" || (f.severity === "warning" && e.severity === "info")) e.severity = f.severity;
  }

  /** The merged cautions, blocking first (see compareCautions). */
  cautions(): Caution[] {
    return [...this.entries.values()]
      .flatMap((m) => [...m.values()])
      .map((e): Caution => {
        const runs = sortedUnique(e.runs);
        const where = runs.length > 1 && e.worstScore > e.leastScore ? ` Worst case: run ${e.worstRun} of ${runs.length} runs.` : "";
        return {
          code: e.code,
          severity: e.severity,
          runs,
          ...(e.component ? { component: e.component } : {}),
          message: e.message() + where,
          remedy: CAUTION_RULES[e.code].remedy,
        };
      })
      .sort(compareCautions);
  }
}

/** The run numbers in ascending order without repeats (usually already so: no copy made). */
function sortedUnique(runs: number[]): number[] {
  let ordered = true;
  for (let i = 1; i < runs.length && ordered; i++) ordered = runs[i - 1]! < runs[i]!;
  if (ordered) return runs;
  return [...new Set(runs)].sort((a, b) => a - b);
}
