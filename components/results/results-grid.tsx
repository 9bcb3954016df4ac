"use client";

import { displayUnit } from "@/lib/units/display-unit";
import { useEffect, useMemo, useRef, useState, type ClipboardEvent, type KeyboardEvent } from "react";
import { postJson } from "@/lib/client/fetch-json";
import { useResults } from "@/lib/hooks/use-results";
import { cellKey } from "@/lib/results/entries";
import { isBlock, moveFocus, pastedBlock, placeBlock, type GridPos } from "@/lib/results/grid-keys";
import { readResultCell, valueWarning } from "@/lib/results/numbers";
import type { ResultRunInput } from "@/lib/results/schemas";
import type { ResultsView } from "@/lib/results/view";
import type { FieldIssue } from "@/lib/errors/app-error";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { CsvUpload } from "./csv-upload";
import { CompletePanel, type StockLine } from "./complete-panel";

/** A run as the grid shows it. */
export interface GridRun {
  run: number;
  runOrder: number;
  kind: string;
  vial: string | null;
  natural: Record<string, number>;
}

type Pending = { runs: ResultRunInput[] } | { csv: string; mapping?: unknown };

const fmt = (v: number) => Number(v.toPrecision(6)).toString();
/** Who entered a saved cell and when (UTC), for its tooltip. */
const enteredText = (c: ResultsView["cells"][number] | undefined) => (c ? `entered by ${c.enteredBy.name || "a member"} on ${c.enteredAt.slice(0, 16).replace("T", " ")} UTC` : undefined);
const storageKey = (planId: string) => `tareline:results-draft:${planId}`;

/**
 * The results grid: one row per run in run order (vial position, natural factor values),
 * one column per response of the study. Arrows, Enter and Tab move between cells; a column
 * or a block pasted from a spreadsheet fills from the focused cell; numbers only (a cell
 * that is not one is marked and keeps what was typed); yields outside 0–100 % are warned.
 * A run can be marked failed with a reason. Saving sends the changed cells to
 * `PUT /plans/{plan}/results`; a failed save keeps everything typed (also across a reload:
 * the drafts are kept in this browser until saved).
 */
export function ResultsGrid({
  labSlug,
  planId,
  runs,
  factors,
  initial,
  canEdit,
  stock,
}: {
  labSlug: string;
  planId: string;
  runs: GridRun[];
  factors: { name: string; unit: string }[];
  initial: ResultsView;
  canEdit: boolean;
  stock: StockLine[];
}) {
  const { data, mutate } = useResults(labSlug, planId, initial);
  const results = data?.results ?? initial;
  const responses = results.responses;
  const rows = useMemo(() => [...runs].sort((a, b) => a.runOrder - b.runOrder || a.run - b.run), [runs]);
  const saved = useMemo(() => new Map(results.cells.map((c) => [cellKey(c.run, c.response), c])), [results.cells]);
  const [drafts, setDrafts] = useState<Record<string, string>>({});
  const [failures, setFailures] = useState<Record<number, string>>({});
  const [failing, setFailing] = useState<{ run: number; reason: string } | null>(null);
  const [focus, setFocus] = useState<GridPos>({ row: 0, col: 0 });
  const [message, setMessage] = useState<{ tone: "ok" | "caution" | "blocks"; text: string; issues?: FieldIssue[] } | null>(null);
  const [issueCells, setIssueCells] = useState<Set<string>>(new Set());
  const [saving, setSaving] = useState(false);
  const [confirming, setConfirming] = useState<Pending | null>(null);
  const inputs = useRef(new Map<string, HTMLInputElement>());
  const editable = canEdit && results.acceptsResults;

  // Drafts survive a reload (and a failed save) until saved.
  useEffect(() => {
    try {
      const raw = localStorage.getItem(storageKey(planId));
      if (raw) {
        const d = JSON.parse(raw) as { drafts?: Record<string, string>; failures?: Record<number, string> };
        setDrafts(d.drafts ?? {});
        setFailures(d.failures ?? {});
      }
    } catch {
      /* a draft that cannot be read is dropped */
    }
  }, [planId]);
  useEffect(() => {
    try {
      if (Object.keys(drafts).length || Object.keys(failures).length) localStorage.setItem(storageKey(planId), JSON.stringify({ drafts, failures }));
      else localStorage.removeItem(storageKey(planId));
    } catch {
      /* storage full or blocked: the drafts stay in the page */
    }
  }, [drafts, failures, planId]);

  const keyAt = (p: GridPos) => cellKey(rows[p.row]!.run, responses[p.col]!.name);
  const focusCell = (p: GridPos) => {
    setFocus(p);
    inputs.current.get(keyAt(p))?.focus();
    inputs.current.get(keyAt(p))?.select();
  };
  const savedText = (run: number, response: string) => {
    const c = saved.get(cellKey(run, response));
    if (!c) return "";
    return c.failed ? "" : c.value === null ? "" : fmt(c.value);
  };
  const shown = (run: number, response: string) => drafts[cellKey(run, response)] ?? savedText(run, response);
  const isFailed = (run: number) => failures[run] !== undefined || responses.some((r) => saved.get(cellKey(run, r.name))?.failed);
  const failReason = (run: number) => failures[run] ?? responses.map((r) => saved.get(cellKey(run, r.name))?.reason).find(Boolean) ?? "";

  const setDraft = (run: number, response: string, text: string) => {
    setDrafts((d) => {
      const k = cellKey(run, response);
      const next = { ...d };
      if (text === savedText(run, response) && !saved.get(k)?.failed) delete next[k];
      else next[k] = text;
      return next;
    });
  };

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>, pos: GridPos) {
    const el = e.currentTarget;
    if (e.key === "Escape") {
      setDraft(rows[pos.row]!.run, responses[pos.col]!.name, savedText(rows[pos.row]!.run, responses[pos.col]!.name));
      return;
    }
    const next = moveFocus(pos, e.key, { shift: e.shiftKey, caretAtStart: el.selectionStart === 0 && el.selectionEnd === 0, caretAtEnd: el.selectionStart === el.value.length }, rows.length, responses.length);
    if (!next) return;
    if (e.key === "Tab" && next.row === pos.row && next.col === pos.col) return; // leave the grid
    e.preventDefault();
    focusCell(next);
  }

  function onPaste(e: ClipboardEvent<HTMLInputElement>, pos: GridPos) {
    const text = e.clipboardData.getData("text/plain");
    if (!isBlock(text)) return;
    e.preventDefault();
    const { placed, outside } = placeBlock(pastedBlock(text), pos, rows.length, responses.length);
    setDrafts((d) => {
      const next = { ...d };
      for (const p of placed) {
        const run = rows[p.row]!.run;
        if (failures[run] !== undefined) continue;
        next[cellKey(run, responses[p.col]!.name)] = p.text.trim();
      }
      return next;
    });
    setMessage(outside > 0 ? { tone: "caution", text: `Pasted ${placed.length} cells; ${outside} fell outside the grid and were left out.` } : { tone: "ok", text: `Pasted ${placed.length} cell${placed.length === 1 ? "" : "s"} from run ${rows[pos.row]!.run} on. Save to store them.` });
  }

  /** The changed runs as a results entry, or the cells that are not numbers. */
  function entry(): { runs: ResultRunInput[]; bad: string[] } {
    const byRun = new Map<number, ResultRunInput>();
    const bad: string[] = [];
    for (const [k, text] of Object.entries(drafts)) {
      const [runText, response] = k.split("\u0000") as [string, string];
      const run = Number(runText);
      if (failures[run] !== undefined) continue;
      const unit = responses.find((r) => r.name === response)?.unit ?? "";
      const reading = readResultCell(text, unit);
      const e = byRun.get(run) ?? { run, responses: {} };
      if (reading.kind === "error") bad.push(k);
      else if (reading.kind === "number") e.responses = { ...(e.responses ?? {}), [response]: reading.value };
      else if (saved.has(k)) e.clear = [...(e.clear ?? []), response];
      else continue;
      byRun.set(run, e);
    }
    for (const [runText, reason] of Object.entries(failures)) byRun.set(Number(runText), { run: Number(runText), responses: null, ...(reason.trim() ? { reason: reason.trim() } : {}) });
    return { runs: [...byRun.values()].filter((r) => r.responses === null || Object.keys(r.responses ?? {}).length > 0 || (r.clear?.length ?? 0) > 0).sort((a, b) => a.run - b.run), bad };
  }

  const pendingCount = Object.keys(drafts).length + Object.keys(failures).length;
  const willComplete = (extra: (run: number, response: string) => boolean) =>
    results.state !== "results_entered" && rows.every((r) => responses.every((resp) => extra(r.run, resp.name) || (saved.has(cellKey(r.run, resp.name)) && drafts[cellKey(r.run, resp.name)] !== ""))) && stock.length > 0;

  async function send(body: Pending & { consumption?: unknown }, sentRuns: ResultRunInput[] | null) {
    setSaving(true);
    setIssueCells(new Set());
    const res = await postJson<{ results: ResultsView; warnings: FieldIssue[]; changed: { set: number; cleared: number; moves: string[]; consumed: number; released: number } }>(`/api/labs/${labSlug}/plans/${planId}/results`, body, "PUT");
    setSaving(false);
    setConfirming(null);
    if (!res.ok) {
      // Nothing is lost: the drafts stay, the cells the server named are marked.
      const marked = new Set<string>();
      for (const i of res.error.issues) {
        const m = /^runs\.(\d+)\.responses\.(\w+)/.exec(i.path);
        const r = m && sentRuns ? sentRuns[Number(m[1])] : undefined;
        if (m && r) marked.add(cellKey(r.run, m[2]!));
      }
      setIssueCells(marked);
      setMessage({ tone: "blocks", text: `Not saved (${res.status === 0 ? "no connection" : res.status}): ${res.error.message} Everything typed is kept; fix it and save again.`, issues: res.error.issues });
      return false;
    }
    if (sentRuns) {
      setDrafts({});
      setFailures({});
    }
    await mutate({ results: res.data.results }, { revalidate: false });
    const c = res.data.changed;
    const parts = [`Saved ${c.set} result${c.set === 1 ? "" : "s"}${c.cleared ? `, removed ${c.cleared}` : ""}.`];
    if (c.moves.length) parts.push(`The plan moved ${c.moves.join(", then ")}.`);
    if (c.consumed + c.released) parts.push(`Stock: ${c.consumed} reservation${c.consumed === 1 ? "" : "s"} consumed, ${c.released} released.`);
    setMessage({ tone: res.data.warnings.length ? "caution" : "ok", text: parts.join(" "), issues: res.data.warnings });
    return true;
  }

  async function save() {
    const { runs: changed, bad } = entry();
    if (bad.length) {
      setIssueCells(new Set(bad));
      setMessage({ tone: "blocks", text: `${bad.length} cell${bad.length === 1 ? " is" : "s are"} not a number (marked). Numbers only; nothing was sent.` });
      return;
    }
    if (changed.length === 0) {
      setMessage({ tone: "caution", text: "Nothing to save." });
      return;
    }
    const touched = new Set(changed.flatMap((r) => (r.responses === null ? responses.map((x) => cellKey(r.run, x.name)) : Object.keys(r.responses ?? {}).map((n) => cellKey(r.run, n)))));
    if (willComplete((run, resp) => touched.has(cellKey(run, resp)))) {
      setConfirming({ runs: changed });
      return;
    }
    await send({ runs: changed }, changed);
  }

  const numberCols = factors.length;
  return (
    <div className="flex flex-col gap-3" data-testid="results-grid">
      <div className="flex flex-wrap items-center gap-2">
        {editable && (
          <>
            <Button onClick={save} disabled={saving || pendingCount === 0} data-testid="save-results">
              {saving ? "Saving…" : pendingCount ? `Save ${pendingCount} change${pendingCount === 1 ? "" : "s"}` : "Saved"}
            </Button>
            {pendingCount > 0 && (
              <Button
                variant="secondary"
                onClick={() => {
                  setDrafts({});
                  setFailures({});
                  setIssueCells(new Set());
                }}
              >
                Discard changes
              </Button>
            )}
            <CsvUpload
              labSlug={labSlug}
              planId={planId}
              onConfirm={async (csv, mapping, runsInFile) => {
                const touched = new Set(runsInFile.flatMap((r) => (r.responses === null ? responses.map((x) => cellKey(r.run, x.name)) : Object.keys(r.responses ?? {}).map((n) => cellKey(r.run, n)))));
                if (willComplete((run, resp) => touched.has(cellKey(run, resp)))) {
                  setConfirming({ csv, mapping });
                  return true;
                }
                return send({ csv, mapping }, null);
              }}
            />
          </>
        )}
        <span className="text-sm text-ink-soft" data-testid="results-status">
          {results.complete ? "Every run has its results." : `${results.missing} of ${rows.length * responses.length} results still to enter.`}
        </span>
      </div>
      {!results.acceptsResults && <Banner tone="info">This plan takes results once it is released; it is {results.state.replace(/_/g, " ")}.</Banner>}
      {message && (
        <Banner tone={message.tone} testId="results-message">
          <p>{message.text}</p>
          {message.issues && message.issues.length > 0 && (
            <ul className="mt-1 list-disc pl-4">
              {message.issues.slice(0, 12).map((i) => (
                <li key={`${i.path}${i.message}`}>
                  <code className="font-mono text-xs">{i.path}</code>: {i.message}
                </li>
              ))}
            </ul>
          )}
        </Banner>
      )}
      {confirming && (
        <CompletePanel
          stock={stock}
          busy={saving}
          onCancel={() => setConfirming(null)}
          onConfirm={(consumption) => void send({ ...confirming, consumption }, "runs" in confirming ? confirming.runs : null)}
        />
      )}
      <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
        <table className="w-full border-collapse text-sm" role="grid" aria-label="Results by run">
          <thead>
            <tr className="border-b border-ink-line text-left text-ink-soft">
              <th className="px-2 py-1.5 text-right font-medium">Order</th>
              <th className="px-2 py-1.5 text-right font-medium">Run</th>
              <th className="px-2 py-1.5 font-medium">Vial</th>
              {factors.map((f) => (
                <th key={f.name} className="px-2 py-1.5 text-right font-medium">
                  <span className="font-mono text-xs">{f.name}</span>
                  <span className="block text-xs font-normal text-ink-faint">{displayUnit(f.unit)}</span>
                </th>
              ))}
              {responses.map((r) => (
                <th key={r.name} className="bg-accent-light/40 px-2 py-1.5 text-right font-medium">
                  {r.name}
                  <span className="block text-xs font-normal text-ink-faint">{r.unit}</span>
                </th>
              ))}
              <th className="px-2 py-1.5 font-medium">Failed</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, ri) => {
              const failed = isFailed(r.run);
              return (
                <tr key={r.run} className={`border-b border-ink-line/60 last:border-0 ${failed ? "bg-paper-deep/60" : ""}`} data-run={r.run}>
                  <td className="num px-2 py-0.5 text-right text-ink-faint">{r.runOrder}</td>
                  <td className="num px-2 py-0.5 text-right">{r.run}</td>
                  <td className="px-2 py-0.5 font-mono text-xs">{r.vial ?? "—"}</td>
                  {factors.map((f) => (
                    <td key={f.name} className="num px-2 py-0.5 text-right">
                      {fmt(r.natural[f.name] ?? NaN)}
                    </td>
                  ))}
                  {responses.map((resp, ci) => {
                    const k = cellKey(r.run, resp.name);
                    const text = shown(r.run, resp.name);
                    const reading = readResultCell(text, resp.unit);
                    const warn = reading.kind === "number" ? valueWarning(reading.value, resp.unit) : null;
                    const bad = reading.kind === "error" || issueCells.has(k);
                    const dirty = drafts[k] !== undefined;
                    return (
                      <td key={resp.name} className="p-0">
                        <input
                          ref={(el) => {
                            if (el) inputs.current.set(k, el);
                            else inputs.current.delete(k);
                          }}
                          className={`num w-24 border-0 bg-transparent px-2 py-1 text-right outline-none focus:bg-accent-light/60 focus:ring-2 focus:ring-accent ${bad ? "bg-blocks-bg text-blocks" : warn ? "bg-caution-bg text-caution" : dirty ? "bg-accent-light/30 font-semibold" : ""}`}
                          value={failed ? "failed" : text}
                          readOnly={!editable || failed}
                          inputMode="decimal"
                          aria-label={`${resp.name} of run ${r.run}`}
                          aria-invalid={bad}
                          title={reading.kind === "error" ? reading.message : (warn ?? enteredText(saved.get(k)))}
                          data-testid={`cell-${r.run}-${resp.name}`}
                          data-row={ri}
                          data-col={ci}
                          onFocus={() => setFocus({ row: ri, col: ci })}
                          onChange={(e) => setDraft(r.run, resp.name, e.target.value)}
                          onKeyDown={(e) => onKeyDown(e, { row: ri, col: ci })}
                          onPaste={(e) => onPaste(e, { row: ri, col: ci })}
                        />
                      </td>
                    );
                  })}
                  <td className="px-2 py-0.5">
                    {failed ? (
                      <span className="flex items-center gap-2 text-xs text-ink-soft">
                        <span title={failReason(r.run)}>failed{failReason(r.run) ? `: ${failReason(r.run)}` : ""}</span>
                        {failures[r.run] !== undefined && (
                          <button type="button" className="text-accent underline-offset-2 hover:underline" onClick={() => setFailures(({ [r.run]: _, ...rest }) => rest)}>
                            undo
                          </button>
                        )}
                      </span>
                    ) : failing?.run === r.run ? (
                      <form
                        className="flex items-center gap-1"
                        onSubmit={(e) => {
                          e.preventDefault();
                          setFailures((f) => ({ ...f, [r.run]: failing.reason }));
                          setFailing(null);
                        }}
                      >
                        <input autoFocus className="w-40 rounded border border-ink-edge px-1 py-0.5 text-xs" placeholder="why it failed" value={failing.reason} onChange={(e) => setFailing({ run: r.run, reason: e.target.value })} data-testid={`fail-reason-${r.run}`} />
                        <Button type="submit" className="px-2 py-0.5 text-xs">
                          Mark
                        </Button>
                      </form>
                    ) : (
                      editable && (
                        <button type="button" className="text-xs text-accent underline-offset-2 hover:underline" onClick={() => setFailing({ run: r.run, reason: "" })} data-testid={`fail-${r.run}`}>
                          mark failed…
                        </button>
                      )
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">
        Arrows, Enter and Tab move between cells; Esc undoes a cell. Paste a column or a block copied from a spreadsheet into the first cell it should fill. {numberCols} factor{numberCols === 1 ? "" : "s"} in natural units; focused cell: run {rows[focus.row]?.run}, {responses[focus.col]?.name}.
      </p>
    </div>
  );
}
