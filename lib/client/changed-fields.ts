/**
 * The fields of `next` whose values differ from `initial` (compared as JSON), for a PATCH
 * that sends only what the person changed.
 */
export function changedFields<T extends Record<string, unknown>>(initial: T, next: T): Partial<T> {
  const out: Partial<T> = {};
  for (const key of Object.keys(next) as Array<keyof T>) {
    if (JSON.stringify(initial[key] ?? null) !== JSON.stringify(next[key] ?? null)) out[key] = next[key];
  }
  return out;
}
