// Small console helpers so every bootstrap step says what it is doing.
const t0 = Date.now();
export function step(message) {
  const s = ((Date.now() - t0) / 1000).toFixed(1).padStart(5);
  console.log(`[tareline ${s}s] ${message}`);
}
export function fail(message) {
  console.error(`\n[tareline] ERROR: ${message}\n`);
  process.exit(1);
}
