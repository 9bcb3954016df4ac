import type { FieldChange } from "@/lib/audit/changes";

/**
 * An entry's changes, one line per field: "label: before → after"; a field newly set shows
 * its value, a field cleared shows what it was and "removed".
 */
export function FieldChanges({ changes }: { changes: FieldChange[] }) {
  if (changes.length === 0) return <span className="text-ink-faint">—</span>;
  return (
    <ul className="flex min-w-64 flex-col gap-0.5" data-testid="audit-changes">
      {changes.map((c) => (
        <li key={c.field} className="break-words">
          <span className="text-ink-soft">{c.label}:</span>{" "}
          {c.before !== null && c.after !== null ? (
            <>
              <span className="num text-ink-faint line-through decoration-ink-faint/60">{c.before}</span>
              <span aria-hidden="true" className="px-1 text-ink-faint">
                →
              </span>
              <span className="sr-only"> changed to </span>
              <span className="num font-medium text-ink">{c.after}</span>
            </>
          ) : c.after !== null ? (
            <span className="num text-ink">{c.after}</span>
          ) : (
            <>
              <span className="num text-ink-faint line-through decoration-ink-faint/60">{c.before}</span> <span className="text-xs text-ink-faint">removed</span>
            </>
          )}
        </li>
      ))}
    </ul>
  );
}
