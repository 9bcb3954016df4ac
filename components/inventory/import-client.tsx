"use client";

import Link from "next/link";
import { useState } from "react";
import type { ImportPreview } from "@/inventory/server/import-containers";
import { postJson } from "@/lib/client/fetch-json";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";

/**
 * CSV import in three steps: choose a file → check the preview (column mapping, every
 * problem by row and column) → confirm. Nothing is written before the confirmation, and
 * the file stays loaded while the mapping is changed.
 */
export function ImportClient({ labSlug }: { labSlug: string }) {
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [mapping, setMapping] = useState<Record<string, string>>({});
  const [preview, setPreview] = useState<ImportPreview | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const [done, setDone] = useState<{ imported: number; newChemicals: number; newLocations: number } | null>(null);

  async function check(text: string, map: Record<string, string>) {
    setBusy(true);
    setMessage(null);
    const res = await postJson<{ preview: ImportPreview }>(`/api/labs/${labSlug}/containers/import/preview`, { csv: text, mapping: map });
    setBusy(false);
    if (!res.ok) {
      setMessage({ tone: "blocks", text: res.error.issues[0]?.message ?? res.error.message });
      return;
    }
    setPreview(res.data.preview);
    setMapping(Object.fromEntries(Object.entries(res.data.preview.mapping).filter((e): e is [string, string] => typeof e[1] === "string")));
  }

  async function onFile(file: File) {
    setDone(null);
    setPreview(null);
    setFileName(file.name);
    const text = await file.text();
    setCsv(text);
    await check(text, {});
  }

  async function confirm() {
    if (!csv) return;
    setBusy(true);
    const res = await postJson<{ result: { imported: number; newChemicals: number; newLocations: number } }>(`/api/labs/${labSlug}/containers/import`, { csv, mapping });
    setBusy(false);
    if (!res.ok) {
      setMessage({ tone: "blocks", text: res.error.message });
      await check(csv, mapping);
      return;
    }
    setDone(res.data.result);
    setPreview(null);
    setCsv(null);
  }

  const changeMapping = (field: string, header: string) => {
    const next = { ...mapping, [field]: header };
    setMapping(next);
    if (csv) void check(csv, next);
  };

  return (
    <div className="flex flex-col gap-4">
      <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-4">
        <h2>1. Choose a CSV file</h2>
        <p className="text-sm text-ink-soft">
          One container per row. Required columns: CAS number, barcode, amount and unit (µg, mg, g, kg, µL, mL or L). Optional: chemical name (needed for a CAS number not yet in the catalogue), location, lot, purity, concentration and its unit (M or mg/mL), solvent, received, opened and expiry dates (YYYY-MM-DD), status, formula, molar mass, density.
        </p>
        <input type="file" accept=".csv,text/csv" aria-label="CSV file" data-testid="import-file" onChange={(e) => e.target.files?.[0] && void onFile(e.target.files[0])} />
        {fileName && <p className="text-xs text-ink-faint">Loaded: {fileName}</p>}
      </section>
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      {done && (
        <Banner tone="ok" testId="import-done">
          Imported {done.imported} container{done.imported === 1 ? "" : "s"} ({done.newChemicals} new chemical{done.newChemicals === 1 ? "" : "s"}, {done.newLocations} new location{done.newLocations === 1 ? "" : "s"}).{" "}
          <Link href={`/labs/${labSlug}/inventory/containers`}>See the containers</Link>
        </Banner>
      )}
      {preview && (
        <>
          <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-4">
            <h2>2. Check the columns</h2>
            <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
              {preview.fields.map((f) => (
                <label key={f.field} className="flex items-center justify-between gap-2 text-sm">
                  <span className="text-ink-soft">{f.label}</span>
                  <select className={`${inputClass} w-44`} value={mapping[f.field] ?? ""} onChange={(e) => changeMapping(f.field, e.target.value)} aria-label={`Column for ${f.label}`}>
                    <option value="">— not in file —</option>
                    {preview.headers.map((h) => (
                      <option key={h} value={h}>
                        {h}
                      </option>
                    ))}
                  </select>
                </label>
              ))}
            </div>
          </section>
          <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-4">
            <h2>3. Review and import</h2>
            <p className="num text-sm">
              {preview.rowCount} row{preview.rowCount === 1 ? "" : "s"} in the file · {preview.rows.length} ready · {preview.issues.length} problem{preview.issues.length === 1 ? "" : "s"} · {preview.newChemicals} new chemical
              {preview.newChemicals === 1 ? "" : "s"} · {preview.newLocations} new location{preview.newLocations === 1 ? "" : "s"}
            </p>
            {preview.issues.length > 0 && (
              <>
                <Banner tone="blocks" testId="import-problems">
                  Fix these in the file (or the column mapping) and load it again. Nothing is imported while any row has a problem.
                </Banner>
                <table className="w-full text-sm" data-testid="import-issues">
                  <thead>
                    <tr className="border-b border-ink-line text-left text-ink-soft">
                      <th className="px-2 py-1 font-medium">Row</th>
                      <th className="px-2 py-1 font-medium">Column</th>
                      <th className="px-2 py-1 font-medium">Problem</th>
                    </tr>
                  </thead>
                  <tbody>
                    {preview.issues.map((i, n) => (
                      <tr key={n} className="border-b border-ink-line/50">
                        <td className="px-2 py-1">{i.row === 0 ? "header" : i.row}</td>
                        <td className="px-2 py-1">{i.column}</td>
                        <td className="px-2 py-1 text-blocks">{i.message}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </>
            )}
            {preview.rows.length > 0 && (
              <table className="w-full text-sm" data-testid="import-rows">
                <thead>
                  <tr className="border-b border-ink-line text-left text-ink-soft">
                    <th className="px-2 py-1 font-medium">Row</th>
                    <th className="px-2 py-1 font-medium">Barcode</th>
                    <th className="px-2 py-1 font-medium">Chemical</th>
                    <th className="px-2 py-1 font-medium">CAS</th>
                    <th className="px-2 py-1 font-medium">Amount</th>
                    <th className="px-2 py-1 font-medium">Location</th>
                    <th className="px-2 py-1 font-medium">Expiry</th>
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.map((r) => (
                    <tr key={r.row} className="border-b border-ink-line/50">
                      <td className="px-2 py-1">{r.row}</td>
                      <td className="px-2 py-1 font-mono text-xs">{r.barcode}</td>
                      <td className="px-2 py-1">
                        {r.chemical} {r.newChemical && <span className="rounded bg-caution-bg px-1 text-xs text-caution">new</span>}
                      </td>
                      <td className="px-2 py-1">{r.cas}</td>
                      <td className="whitespace-nowrap px-2 py-1">{r.amount}</td>
                      <td className="px-2 py-1">
                        {r.location ?? "—"} {r.newLocation && <span className="rounded bg-caution-bg px-1 text-xs text-caution">new</span>}
                      </td>
                      <td className="px-2 py-1">{r.expiresOn ?? "—"}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
            <div>
              <Button onClick={() => void confirm()} disabled={busy || preview.issues.length > 0 || preview.rows.length === 0} data-testid="import-confirm">
                {busy ? "Working…" : `Import ${preview.rows.length} container${preview.rows.length === 1 ? "" : "s"}`}
              </Button>
            </div>
          </section>
        </>
      )}
    </div>
  );
}
