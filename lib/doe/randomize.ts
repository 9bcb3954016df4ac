/**
 * Seeded, reproducible randomisation of run order (Fisher–Yates shuffle, Knuth, The Art
 * of Computer Programming vol. 2, Algorithm 3.4.2P) driven by the seedrandom ARC4
 * generator, within blocks and optionally grouped by a hard-to-change factor
 * (split-plot style: the groups are run in random order, and the runs in random order
 * inside each group).
 */
import seedrandom from "seedrandom";

/** A uniform [0, 1) generator. */
export type Rng = () => number;

/** A seeded generator; the same seed always gives the same sequence. */
export function seededRng(seed: number | string): Rng {
  return seedrandom(String(seed));
}

/** Shuffles a copy of `items` with Fisher–Yates using `rng`. */
export function shuffle<T>(items: readonly T[], rng: Rng): T[] {
  const a = [...items];
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rng() * (i + 1));
    const t = a[i]!;
    a[i] = a[j]!;
    a[j] = t;
  }
  return a;
}

/** A run as far as run ordering needs it. */
export interface OrderableRun {
  block: number;
  /** The coded level of the hard-to-change factor, if any. */
  group?: number;
}

/**
 * The run order (1-based position) of each run: blocks in increasing order; inside a
 * block, runs grouped by `group` when given; groups and runs within groups shuffled
 * when `rng` is given, else kept in standard order (groups by increasing level).
 * Returns an array `order` with order[i] = run order of runs[i].
 */
export function assignRunOrder(runs: readonly OrderableRun[], rng: Rng | null): number[] {
  const blocks = [...new Set(runs.map((r) => r.block))].sort((a, b) => a - b);
  const sequence: number[] = [];
  for (const b of blocks) {
    const idx = runs.map((r, i) => (r.block === b ? i : -1)).filter((i) => i >= 0);
    const hasGroups = idx.some((i) => runs[i]!.group !== undefined);
    if (!hasGroups) {
      sequence.push(...(rng ? shuffle(idx, rng) : idx));
      continue;
    }
    const groups = new Map<number, number[]>();
    for (const i of idx) {
      const key = Math.round((runs[i]!.group ?? 0) * 1e9) / 1e9;
      const g = groups.get(key);
      if (g) g.push(i);
      else groups.set(key, [i]);
    }
    let keys = [...groups.keys()].sort((a, b) => a - b);
    if (rng) keys = shuffle(keys, rng);
    for (const key of keys) {
      const members = groups.get(key)!;
      sequence.push(...(rng ? shuffle(members, rng) : members));
    }
  }
  const order = new Array<number>(runs.length);
  sequence.forEach((runIndex, pos) => (order[runIndex] = pos + 1));
  return order;
}
