/**
 * The JSON body of `GET /plans/{plan}`. Its bulk is the run sheet (about 350 kB for 96 runs),
 * and the run sheet of a cached evaluation (lib/plans/evaluate.ts) is one frozen object shared
 * by every request for that plan: its JSON is encoded once per object (a WeakMap, so it goes
 * when the evaluation leaves the cache) and spliced into the rest of the plan, serialized per
 * request. The bytes are exactly `JSON.stringify({ plan })`.
 */
import { randomUUID } from "node:crypto";

const encoded = new WeakMap<object, Uint8Array<ArrayBuffer>>();
const utf8 = new TextEncoder();
/** A placeholder no document can contain (random per process). */
const MARK = JSON.stringify(`tareline-run-sheet-${randomUUID()}`);

function bytesOnce(value: object): Uint8Array<ArrayBuffer> {
  let b = encoded.get(value);
  if (!b) {
    b = utf8.encode(JSON.stringify(value));
    // Only frozen objects can be shared safely (a cached evaluation is frozen).
    if (Object.isFrozen(value)) encoded.set(value, b);
  }
  return b;
}

/** `{ plan }` as the JSON bytes of a response, the run sheet's part encoded once per cached evaluation. */
export function planJsonBytes(plan: { runSheet: object | null }): Uint8Array<ArrayBuffer> {
  if (plan.runSheet === null) return utf8.encode(JSON.stringify({ plan }));
  const head = JSON.stringify({ plan: { ...plan, runSheet: JSON.parse(MARK) as string } });
  const at = head.indexOf(MARK);
  if (at < 0 || head.indexOf(MARK, at + 1) >= 0) return utf8.encode(JSON.stringify({ plan }));
  const parts = [utf8.encode(head.slice(0, at)), bytesOnce(plan.runSheet), utf8.encode(head.slice(at + MARK.length))];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let offset = 0;
  for (const p of parts) {
    out.set(p, offset);
    offset += p.length;
  }
  return out;
}
