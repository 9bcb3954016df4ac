/**
 * A tiny benchmark harness: each case runs a few warm-ups, then `repeat` timed runs;
 * we print median, min, max and the target. Benchmarks are never tests: nothing here
 * fails the build on a slow machine.
 */
export interface BenchCase {
  /** Short label, e.g. "fit: 6-factor quadratic, 1536 runs, backward elimination". */
  name: string;
  /** The target from the issue, in milliseconds. */
  targetMs: number;
  /** Repetitions (default 15) and warm-ups (default 3). */
  repeat?: number;
  warmup?: number;
  /** Builds the inputs (not timed). */
  setup?: () => unknown;
  /** The timed work; receives what setup returned. */
  run: (state: unknown) => unknown;
  /** Extra lines printed under the case's result (a comparison, a check), not timed. */
  note?: (result: BenchResult, state: unknown) => string[];
}

/**
 * A case measured by its own means rather than timed runs (a load test against the running
 * app): it returns the figure compared with the target, a line of detail, and notes.
 */
export interface MeasuredBenchCase {
  name: string;
  targetMs: number;
  measure: () => Promise<{ valueMs: number; detail: string; notes: string[] }>;
}

export interface BenchResult {
  name: string;
  medianMs: number;
  minMs: number;
  maxMs: number;
  targetMs: number;
  repeat: number;
}

export function runCase(c: BenchCase): BenchResult & { notes: string[] } {
  const repeat = c.repeat ?? 15;
  const warmup = c.warmup ?? 3;
  const state = c.setup ? c.setup() : undefined;
  for (let i = 0; i < warmup; i++) c.run(state);
  const times: number[] = [];
  for (let i = 0; i < repeat; i++) {
    const t0 = performance.now();
    c.run(state);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const mid = Math.floor(times.length / 2);
  const median = times.length % 2 ? times[mid]! : (times[mid - 1]! + times[mid]!) / 2;
  const result: BenchResult = { name: c.name, medianMs: median, minMs: times[0]!, maxMs: times[times.length - 1]!, targetMs: c.targetMs, repeat };
  return { ...result, notes: c.note ? c.note(result, state) : [] };
}

/** A case whose work is asynchronous (e.g. a PDF rendered through a promise): each timed run is awaited. */
export interface AsyncBenchCase extends Omit<BenchCase, "run"> {
  runAsync: (state: unknown) => Promise<unknown>;
  /** Builds the inputs asynchronously (e.g. rows in a database), not timed; used instead of `setup`. */
  setupAsync?: () => Promise<unknown>;
}

export async function runCaseAsync(c: AsyncBenchCase): Promise<BenchResult & { notes: string[] }> {
  const repeat = c.repeat ?? 15;
  const warmup = c.warmup ?? 3;
  const state = c.setupAsync ? await c.setupAsync() : c.setup ? c.setup() : undefined;
  for (let i = 0; i < warmup; i++) await c.runAsync(state);
  const times: number[] = [];
  for (let i = 0; i < repeat; i++) {
    const t0 = performance.now();
    await c.runAsync(state);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const mid = Math.floor(times.length / 2);
  const median = times.length % 2 ? times[mid]! : (times[mid - 1]! + times[mid]!) / 2;
  const result: BenchResult = { name: c.name, medianMs: median, minMs: times[0]!, maxMs: times[times.length - 1]!, targetMs: c.targetMs, repeat };
  return { ...result, notes: c.note ? c.note(result, state) : [] };
}
