"use client";

import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";

/** A new token's secret, shown this once, with a copy button and an example request. */
export function OneTimeSecret({ name, secret, example, onDone }: { name: string; secret: string; example: string; onDone: () => void }) {
  const [copied, setCopied] = useState<"copied" | "failed" | null>(null);
  const code = useRef<HTMLElement>(null);
  async function copy() {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied("copied");
    } catch {
      // No clipboard access (an insecure context or a refused permission): select the text for Ctrl+C.
      const range = document.createRange();
      if (code.current) range.selectNodeContents(code.current);
      window.getSelection()?.removeAllRanges();
      window.getSelection()?.addRange(range);
      setCopied("failed");
    }
  }
  return (
    <section className="flex flex-col gap-3 rounded-lg border border-ok/40 bg-ok-bg p-4" data-testid="token-secret-panel" aria-labelledby="token-secret-title">
      <div>
        <h2 id="token-secret-title" className="text-ok">
          Token “{name}” created
        </h2>
        <p className="mt-1 text-sm text-ink">Copy it now and keep it somewhere safe, such as your pipeline&apos;s secret store. It will not be shown again: only its fingerprint is kept.</p>
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <code ref={code} className="min-w-0 flex-1 break-all rounded-md border border-ink-line bg-paper-card px-3 py-2 font-mono text-sm text-ink" data-testid="token-secret">
          {secret}
        </code>
        <Button type="button" onClick={() => void copy()}>
          {copied === "copied" ? "Copied" : "Copy"}
        </Button>
      </div>
      {copied === "failed" && <p className="text-xs text-ink-soft">Copying is not allowed here; the token is selected, press Ctrl+C (⌘C).</p>}
      <details className="text-sm">
        <summary className="cursor-pointer text-ink-soft">Example request</summary>
        <pre className="mt-2 overflow-x-auto rounded-md bg-paper-card px-3 py-2 font-mono text-xs text-ink">{example}</pre>
      </details>
      <div>
        <Button type="button" variant="secondary" onClick={onDone}>
          I have copied it
        </Button>
      </div>
    </section>
  );
}
