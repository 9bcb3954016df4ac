"use client";

import { useRef, useState } from "react";
import { postJson } from "@/lib/client/fetch-json";
import type { ParsedResultsCsv } from "@/lib/results/csv-import";
import type { ResultRun } from "@/lib/results/schemas";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";

/**
 * Upload a results CSV: the file is checked by `POST …/results/preview` (mapped by run
 * number or vial position; every bad row and column named) and nothing is stored until
 * the chemist confirms, which sends the same file to `PUT …/results`.
 */
export function CsvUpload({ labSlug, planId, onConfirm }: { labSlug: string; planId: string; onConfirm: (csv: string, mapping: ParsedResultsCsv["mapping"], runs: ResultRun[]) => Promise<boolean> }) {
  const input = useRef<HTMLInputElement | null>(null);
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [preview, setPreview] = useState<ParsedResultsCsv | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function choose(f: File | undefined) {
    if (!f) return;
    setError(null);
    setPreview(null);
    const text = await f.text();
    setFile({ name: f.name, text });
    setBusy(true);
    const res = await postJson<{ preview: ParsedResultsCsv }>(`/api/labs/${labSlug}/plans/${planId}/results/preview`, { csv: text });
    setBusy(false);
    if (!res.ok) return setError(res.error.issues[0] ? `${res.error.message} (${res.error.issues[0].path}: ${res.error.issues[0].message})` : res.error.message);
    setPreview(res.data.preview);
  }
  const reset = () => {
    setFile(null);
    setPreview(null);
    if (input.current) input.current.value = "";
  };

  return (
    <>
      <label className="inline-flex cursor-pointer items-center rounded-md border border-ink-edge bg-paper-card px-3 py-1.5 text-sm font-medium hover:bg-paper-deep">
        Upload CSV…
        <input ref={input} type="file" accept=".csv,text/csv,text/plain" className="sr-only" onChange={(e) => void choose(e.target.files?.[0])} data-testid="csv-file" />
      </label>
      {error && <Banner tone="blocks">{error}</Banner>}
      {file && preview && (
        <div className="w-full rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="csv-preview">
          <p className="mb-2">
            <span className="font-medium">{file.name}</span>: {preview.rowCount} row{preview.rowCount === 1 ? "" : "s"}, matched by {preview.mapBy === "vial" ? "vial position" : preview.mapBy === "run" ? "run number" : "—"}
            {Object.keys(preview.mapping.responses).length > 0 && <> · columns {Object.entries(preview.mapping.responses).map(([r, h]) => `${h} → ${r}`).join(", ")}</>}
            {preview.mapping.reason && <> · {preview.mapping.reason} → failure reason</>}
          </p>
          {preview.issues.length > 0 ? (
            <div data-testid="csv-issues">
              <p className="font-medium text-blocks">
                {preview.issues.length} problem{preview.issues.length === 1 ? "" : "s"}; nothing will be stored until the file is fixed:
              </p>
              <ul className="mt-1 list-disc pl-5 text-blocks">
                {preview.issues.slice(0, 50).map((i, k) => (
                  <li key={k}>{i.row === 0 ? i.message : `row ${i.row}, column ${i.column}: ${i.message}`}</li>
                ))}
              </ul>
            </div>
          ) : (
            <table className="mb-2 text-xs">
              <thead>
                <tr className="text-left text-ink-soft">
                  <th className="pr-3 font-medium">Row</th>
                  <th className="pr-3 font-medium">Run</th>
                  {Object.keys(preview.mapping.responses).map((r) => (
                    <th key={r} className="pr-3 text-right font-medium">
                      {r}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {preview.rows.slice(0, 12).map((r) => (
                  <tr key={r.row}>
                    <td className="num pr-3">{r.row}</td>
                    <td className="num pr-3">{r.run}</td>
                    {Object.keys(preview.mapping.responses).map((n) => (
                      <td key={n} className="num pr-3 text-right">
                        {r.values[n] === undefined ? "" : r.values[n] === null ? `failed${r.reason ? ` (${r.reason})` : ""}` : r.values[n]}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {preview.warnings.length > 0 && (
            <ul className="mb-2 list-disc pl-5 text-caution">
              {preview.warnings.slice(0, 20).map((w, k) => (
                <li key={k}>{`row ${w.row}, column ${w.column}: ${w.message}`}</li>
              ))}
            </ul>
          )}
          <div className="flex gap-2">
            <Button
              disabled={busy || preview.issues.length > 0 || preview.runs.length === 0}
              data-testid="csv-confirm"
              onClick={async () => {
                setBusy(true);
                const ok = await onConfirm(file.text, preview.mapping, preview.runs);
                setBusy(false);
                if (ok) reset();
              }}
            >
              Store {preview.runs.length} run{preview.runs.length === 1 ? "" : "s"}
            </Button>
            <Button variant="secondary" onClick={reset}>
              Cancel
            </Button>
          </div>
        </div>
      )}
    </>
  );
}
