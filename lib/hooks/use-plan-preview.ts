"use client";

import { useEffect, useRef, useState } from "react";
import type { FieldIssue } from "@/lib/errors/app-error";
import type { PlanPreview } from "@/lib/plans/preview";

export type PreviewStatus =
  /** Nothing asked yet. */
  | "idle"
  /** The document has errors the browser found; the preview waits for them to be fixed. */
  | "waiting"
  /** A request is on its way (or about to be sent: the typing pause has not passed yet). */
  | "computing"
  /** The preview shows the document as it is now. */
  | "ready"
  /** The server refused the document (422): `issues` name the fields. */
  | "invalid"
  /** The server could not be reached or failed; the last preview stays. */
  | "error";

export interface PlanPreviewState {
  status: PreviewStatus;
  /** The last preview computed (kept while a newer one is computed or refused). */
  preview: PlanPreview | null;
  /** Whether `preview` is of an older document than the one in the form. */
  stale: boolean;
  /** The server's issues (paths under `document.`) when it refused the document. */
  issues: FieldIssue[];
  message: string | null;
  /** How long the last answered request took, from sending to the parsed answer (ms). */
  roundTripMs: number | null;
}

const INITIAL: PlanPreviewState = { status: "idle", preview: null, stale: false, issues: [], message: null, roundTripMs: null };

/**
 * The live preview of a plan document (POST /api/labs/{lab}/plans/preview), recomputed
 * `delayMs` after the document last changed. `document` is null while the form has errors
 * the browser found: the preview then waits, keeping the last one. Answers that arrive out
 * of order are dropped, and a newer document aborts the request of an older one.
 */
export function usePlanPreview(labSlug: string, document: Record<string, unknown> | null, delayMs = 300): PlanPreviewState {
  const [state, setState] = useState<PlanPreviewState>(INITIAL);
  const key = document === null ? null : JSON.stringify({ document });
  const seq = useRef(0);

  useEffect(() => {
    const mine = ++seq.current;
    if (key === null) {
      setState((s) => ({ ...s, status: "waiting", stale: s.preview !== null, issues: [], message: null }));
      return;
    }
    setState((s) => ({ ...s, status: "computing", stale: s.preview !== null }));
    const abort = new AbortController();
    const timer = setTimeout(async () => {
      const started = performance.now();
      let res: Response;
      try {
        res = await fetch(`/api/labs/${labSlug}/plans/preview`, { method: "POST", headers: { "content-type": "application/json" }, body: key, signal: abort.signal });
      } catch {
        if (abort.signal.aborted || mine !== seq.current) return;
        setState((s) => ({ ...s, status: "error", message: "Could not reach the server; the preview shows the last answer.", issues: [] }));
        return;
      }
      const json = (await res.json().catch(() => null)) as { preview?: PlanPreview; error?: { message?: string; issues?: FieldIssue[] } } | null;
      if (abort.signal.aborted || mine !== seq.current) return;
      const roundTripMs = performance.now() - started;
      if (res.ok && json?.preview) {
        setState({ status: "ready", preview: json.preview, stale: false, issues: [], message: null, roundTripMs });
      } else if (res.status === 422) {
        setState((s) => ({ ...s, status: "invalid", issues: json?.error?.issues ?? [], message: json?.error?.message ?? "The plan is not valid.", roundTripMs }));
      } else {
        setState((s) => ({ ...s, status: "error", issues: [], message: json?.error?.message ?? `The server answered ${res.status}.`, roundTripMs }));
      }
    }, delayMs);
    return () => {
      clearTimeout(timer);
      abort.abort();
    };
  }, [labSlug, key, delayMs]);

  return state;
}
