/** The standing notice on every page: cautions are planning aids; people and rules decide. */
export const SAFETY_NOTICE =
  "Tareline's cautions are planning aids, not a risk assessment. Local regulations, your institution's chemical hygiene plan and the judgement of qualified staff decide.";

export function SafetyNotice() {
  return (
    <footer className="border-t border-ink-line px-6 py-4 text-xs text-ink-faint" data-testid="safety-notice">
      {SAFETY_NOTICE}
    </footer>
  );
}
