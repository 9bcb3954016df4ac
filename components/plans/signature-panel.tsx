/**
 * The plan's e-signature (issue 11): who signed, when, what the signature means, and the
 * SHA-256 of the content signed, with whether it still applies — valid while the plan's
 * content is the one signed and no edit voided it since. The plan's current hash is shown
 * beside it, so anyone can see that the two agree (or not).
 */
import type { PlanView } from "@/lib/plans/view";
import { When } from "@/components/studies/bits";

export function SignaturePanel({ plan }: { plan: Pick<PlanView, "signature" | "contentHash" | "state" | "signOffRequired"> }) {
  const s = plan.signature;
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" aria-label="Signature" data-testid="signature-panel">
      <h2 className="text-base">Signature</h2>
      {!s ? (
        <p className="text-ink-soft" data-testid="signature-none">
          {plan.signOffRequired ? "Not signed yet. A rule of the lab asks for a safety officer's sign-off before release." : "Not signed. No rule of the lab asks for sign-off; it may be released without review."}
        </p>
      ) : (
        <>
          <p>
            <span
              className={`mr-2 rounded px-1.5 py-0.5 text-xs font-medium ${s.valid ? "bg-ok-bg text-ok" : "bg-blocks-bg text-blocks"}`}
              data-testid="signature-validity"
            >
              {s.valid ? "Valid" : "Void"}
            </span>
            <span data-testid="signature-meaning">{s.meaning[0]!.toUpperCase() + s.meaning.slice(1)}</span>
          </p>
          <p className="text-ink-soft">
            Signed by <span className="text-ink">{s.signerName}</span> on <When iso={s.signedAt} /> UTC
          </p>
          {!s.valid && <p className="text-blocks">The plan changed after it was signed: this signature no longer applies to it.</p>}
          <dl className="grid grid-cols-[auto_1fr] gap-x-2 gap-y-1 text-xs">
            <dt className="text-ink-faint">Signed SHA-256</dt>
            <dd className="break-all font-mono" data-testid="signature-hash">
              {s.contentHash}
            </dd>
            <dt className="text-ink-faint">Plan SHA-256</dt>
            <dd className={`break-all font-mono ${s.contentHash === plan.contentHash ? "" : "text-blocks"}`}>{plan.contentHash}</dd>
          </dl>
        </>
      )}
    </section>
  );
}
