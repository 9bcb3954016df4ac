/**
 * The review queue's order, pure: plans waiting for a safety officer, worst caution first
 * (blocking, then warning, then info, then none), then the longest waiting.
 */
import type { Severity } from "../hazards/caution-rules";

export interface QueueEntry {
  worst: Severity | null;
  submittedAt: string | null;
}

const RANK: Record<Severity, number> = { blocking: 3, warning: 2, info: 1 };
const rank = (s: Severity | null) => (s ? RANK[s] : 0);

/** The worst severity among `cautions`, or null when there are none. */
export function worstSeverity(cautions: ReadonlyArray<{ severity: Severity }>): Severity | null {
  return cautions.reduce<Severity | null>((w, c) => (rank(c.severity) > rank(w) ? c.severity : w), null);
}

/** Worst caution first, then the oldest submission first. */
export function compareQueueEntries(a: QueueEntry, b: QueueEntry): number {
  return rank(b.worst) - rank(a.worst) || (a.submittedAt ?? "").localeCompare(b.submittedAt ?? "");
}

/** "3 h", "2 d": how long a plan has waited, in whole units (minutes under an hour). */
export function waitedFor(sinceIso: string | null, now: Date): string {
  if (!sinceIso) return "—";
  const minutes = Math.max(0, Math.floor((now.getTime() - new Date(sinceIso).getTime()) / 60_000));
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h`;
  return `${Math.floor(hours / 24)} d`;
}
