/** Run numbers in words: "run 3", "runs 1–4, 7, 9–10" (consecutive runs as ranges). Pure. */
export function runList(runs: readonly number[]): string {
  const sorted = [...new Set(runs)].sort((a, b) => a - b);
  if (sorted.length === 0) return "no run";
  const parts: string[] = [];
  let start = sorted[0]!;
  let prev = start;
  for (const r of [...sorted.slice(1), Number.NaN]) {
    if (r === prev + 1) {
      prev = r;
      continue;
    }
    parts.push(start === prev ? String(start) : prev === start + 1 ? `${start}, ${prev}` : `${start}–${prev}`);
    start = r;
    prev = r;
  }
  return `${sorted.length === 1 ? "run" : "runs"} ${parts.join(", ")}`;
}
