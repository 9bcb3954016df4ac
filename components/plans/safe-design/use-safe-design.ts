"use client";

import { useEffect, useRef, useState } from "react";
import type { AlternativeKind } from "@/lib/doe/safe-alternatives";
import type { FieldIssue } from "@/lib/errors/app-error";
import { QUICK_ALTERNATIVES } from "@/lib/plans/safe-design-labels";
import type { SafeDesignAlternative, SafeDesignReport } from "@/lib/plans/safe-design";

export type SafeDesignStatus =
  /** No document to judge yet (the form has errors, or the preview is not ready). */
  | "idle"
  | "computing"
  | "ready"
  /** The server refused the document (its issues show on the editor's fields through the preview). */
  | "invalid"
  | "error";

export interface SafeDesignState {
  status: SafeDesignStatus;
  report: SafeDesignReport | null;
  /** The D-optimal alternative, searched for after the quick ones: null while searching (or when nothing blocks). */
  dOptimal: SafeDesignAlternative | null;
  dOptimalStatus: "idle" | "computing" | "ready" | "error";
  message: string | null;
}

const INITIAL: SafeDesignState = { status: "idle", report: null, dOptimal: null, dOptimalStatus: "idle", message: null };

async function ask(labSlug: string, document: Record<string, unknown>, kinds: readonly AlternativeKind[], signal: AbortSignal): Promise<{ ok: true; report: SafeDesignReport } | { ok: false; status: number; message: string; issues: FieldIssue[] }> {
  const res = await fetch(`/api/labs/${labSlug}/plans/alternatives`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ document, kinds }), signal });
  const json = (await res.json().catch(() => null)) as (SafeDesignReport & { error?: { message?: string; issues?: FieldIssue[] } }) | null;
  if (res.ok && json) return { ok: true, report: json };
  return { ok: false, status: res.status, message: json?.error?.message ?? `The server answered ${res.status}.`, issues: json?.error?.issues ?? [] };
}

/**
 * The safe-design report of the document in the editor (POST /plans/alternatives), asked
 * `delayMs` after the document last changed: first the blocking runs and the quick
 * alternatives (face-centred, inscribed, smaller α, narrower range; well under a second),
 * then, when something blocks, the D-optimal alternative on its own (a search of up to about
 * a second for six factors, bench/safe-design.bench.ts). A newer document aborts the
 * requests of an older one; answers out of order are dropped.
 */
export function useSafeDesign(labSlug: string, document: Record<string, unknown> | null, delayMs = 250): SafeDesignState {
  const [state, setState] = useState<SafeDesignState>(INITIAL);
  const key = document === null ? null : JSON.stringify(document);
  const seq = useRef(0);

  useEffect(() => {
    const mine = ++seq.current;
    if (key === null) {
      setState((s) => ({ ...s, status: s.report ? s.status : "idle" }));
      return;
    }
    const doc = JSON.parse(key) as Record<string, unknown>;
    const abort = new AbortController();
    const current = () => !abort.signal.aborted && mine === seq.current;
    setState((s) => ({ ...s, status: "computing" }));
    const timer = setTimeout(async () => {
      try {
        const quick = await ask(labSlug, doc, QUICK_ALTERNATIVES, abort.signal);
        if (!current()) return;
        if (!quick.ok) {
          setState({ ...INITIAL, status: quick.status === 422 ? "invalid" : "error", message: quick.message });
          return;
        }
        const blocks = quick.report.blockingRuns.length > 0 && quick.report.note === null;
        setState({ status: "ready", report: quick.report, dOptimal: null, dOptimalStatus: blocks ? "computing" : "idle", message: null });
        if (!blocks) return;
        const searched = await ask(labSlug, doc, ["d-optimal"], abort.signal);
        if (!current()) return;
        const alt = searched.ok ? (searched.report.alternatives.find((a) => a.kind === "d-optimal") ?? null) : null;
        setState((s) => ({ ...s, dOptimal: alt, dOptimalStatus: alt ? "ready" : "error" }));
      } catch {
        if (!current()) return;
        setState((s) => ({ ...s, status: s.report ? s.status : "error", dOptimalStatus: s.dOptimalStatus === "computing" ? "error" : s.dOptimalStatus, message: "Could not reach the server for the safe-design alternatives." }));
      }
    }, delayMs);
    return () => {
      clearTimeout(timer);
      abort.abort();
    };
  }, [labSlug, key, delayMs]);

  return state;
}
