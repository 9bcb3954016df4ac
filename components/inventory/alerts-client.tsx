"use client";

import Link from "next/link";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { availabilityInputSchema, type AvailabilityInput, type ContainerRow } from "@/inventory/schemas";
import { useStockAlerts, type StockAlerts } from "@/lib/hooks/use-inventory";
import { postJson } from "@/lib/client/fetch-json";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Amount, ExpiryDate } from "./bits";
import { rational, toDecimalString } from "@/inventory/decimal";
import { isPeroxideTestDue } from "@/lib/hazards/peroxide-due";

interface AvailabilityResult {
  lines: Array<{ requirement: number; chemicalId: string; chemicalName: string; picks: Array<{ containerId: string; barcode: string; amountBase: string; dimension: "mass" | "volume"; display: string }>; shortfall: { amount: number; unit: string } | null }>;
  shortfalls: Array<{ chemicalId: string; name: string; amount: number; unit: string; label?: string }>;
  warnings: Array<{ code: string; chemicalId: string; containerId?: string; message: string }>;
}

const REQ_UNITS = ["mmol", "µmol", "mg", "g", "µL", "mL"];

function ContainerList({ labSlug, rows, today, empty, extra }: { labSlug: string; rows: ContainerRow[]; today: string; empty: string; extra?: (r: ContainerRow) => React.ReactNode }) {
  if (rows.length === 0) return <p className="text-sm text-ink-faint">{empty}</p>;
  return (
    <ul className="divide-y divide-ink-line/60 text-sm">
      {rows.map((r) => (
        <li key={r.id} className="flex flex-wrap items-baseline justify-between gap-2 py-1.5">
          <span>
            <Link href={`/labs/${labSlug}/inventory/containers/${r.id}`} className="font-mono text-xs">
              {r.barcode}
            </Link>{" "}
            {r.chemicalName} · <Amount value={r.amount} />
          </span>
          <span>{extra ? extra(r) : <ExpiryDate date={r.expiresOn} today={today} />}</span>
        </li>
      ))}
    </ul>
  );
}

export function AlertsClient({ labSlug, canManage, initial, chemicals }: { labSlug: string; canManage: boolean; initial: StockAlerts; chemicals: Array<{ id: string; name: string }> }) {
  const { data, mutate } = useStockAlerts(labSlug, initial);
  const a = data?.alerts ?? initial;
  const [result, setResult] = useState<AvailabilityResult | null>(null);
  const [planRef, setPlanRef] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, control, handleSubmit, formState } = useForm<AvailabilityInput, unknown, z.output<typeof availabilityInputSchema>>({
    resolver: zodResolver(availabilityInputSchema),
    defaultValues: { requirements: [{ chemicalId: "", amount: "", unit: "mmol", label: "" }] },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "requirements" });
  const onCheck = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson<{ availability: AvailabilityResult }>(`/api/labs/${labSlug}/inventory/availability`, values);
    if (!res.ok) {
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    setResult(res.data.availability);
  });
  async function reserve() {
    if (!result) return;
    const lines = result.lines.flatMap((l) => l.picks.map((p) => ({ containerId: p.containerId, amount: p.dimension === "mass" ? p.amountBase : toDecimalString(rational(BigInt(p.amountBase), 1000n), 3), unit: p.dimension === "mass" ? "µg" : "µL" })));
    const res = await postJson(`/api/labs/${labSlug}/reservations`, { planRef, lines, note: "Reserved from the availability check" });
    setMessage(res.ok ? { tone: "ok", text: `Reserved ${lines.length} amount${lines.length === 1 ? "" : "s"} for ${planRef}.` } : { tone: "blocks", text: res.error.message });
    if (res.ok) {
      setResult(null);
      void mutate();
    }
  }
  const reqErr = formState.errors.requirements;
  return (
    <div className="flex flex-col gap-5">
      <div className="grid gap-4 lg:grid-cols-2">
        <section className="rounded-lg border border-ink-line bg-paper-card p-4" data-testid="low-stock">
          <h2 className="mb-2">Low stock</h2>
          {a.lowStock.length === 0 ? (
            <p className="text-sm text-ink-faint">Every chemical with a low-stock mark is above it.</p>
          ) : (
            <ul className="divide-y divide-ink-line/60 text-sm">
              {a.lowStock.map((l) => (
                <li key={l.chemicalId} className="flex justify-between gap-2 py-1.5">
                  <span>{l.name}</span>
                  <span>
                    <span className="font-medium text-caution">
                      <Amount value={l.free} />
                    </span>{" "}
                    free · mark <Amount value={l.mark} />
                  </span>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section className="rounded-lg border border-ink-line bg-paper-card p-4" data-testid="peroxide-due">
          <h2 className="mb-2">Peroxide formers to test</h2>
          <ContainerList labSlug={labSlug} rows={a.peroxideDue} today={a.today} empty="No peroxide former is due for a test within 30 days." extra={(r) => <span className={`num ${r.flags.peroxideTestDue && isPeroxideTestDue(r.flags.peroxideTestDue, a.today) ? "font-medium text-blocks" : "text-caution"}`}>test due {r.flags.peroxideTestDue}</span>} />
        </section>
        <section className="rounded-lg border border-ink-line bg-paper-card p-4">
          <h2 className="mb-2">Expired</h2>
          <ContainerList labSlug={labSlug} rows={a.expired} today={a.today} empty="No expired container is in stock." />
        </section>
        <section className="rounded-lg border border-ink-line bg-paper-card p-4">
          <h2 className="mb-2">Expiring within 30 days</h2>
          <ContainerList labSlug={labSlug} rows={a.nearExpiry} today={a.today} empty="Nothing expires in the next 30 days." />
        </section>
      </div>

      <section className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4">
        <h2>Check availability and shortfalls</h2>
        <p className="text-sm text-ink-soft">Enter what a run sheet needs. Tareline proposes containers (first to expire first, opened before sealed, one container where possible) and says what is short. This only reads stock.</p>
        <form onSubmit={onCheck} noValidate className="flex flex-col gap-2">
          {fields.map((f, i) => (
            <div key={f.id} className="grid gap-2 sm:grid-cols-[2fr_1fr_7rem_2fr_auto] sm:items-end">
              <Field label="Chemical" htmlFor={`req-${i}-chem`} error={reqErr?.[i]?.chemicalId?.message}>
                <select id={`req-${i}-chem`} className={inputClass} {...register(`requirements.${i}.chemicalId`)}>
                  <option value="">Choose…</option>
                  {chemicals.map((c) => (
                    <option key={c.id} value={c.id}>
                      {c.name}
                    </option>
                  ))}
                </select>
              </Field>
              <Field label="Amount" htmlFor={`req-${i}-amount`} error={reqErr?.[i]?.amount?.message}>
                <input id={`req-${i}-amount`} inputMode="decimal" className={`${inputClass} num`} {...register(`requirements.${i}.amount`)} />
              </Field>
              <Field label="Unit" htmlFor={`req-${i}-unit`} error={reqErr?.[i]?.unit?.message}>
                <select id={`req-${i}-unit`} className={inputClass} {...register(`requirements.${i}.unit`)}>
                  {REQ_UNITS.map((u) => (
                    <option key={u}>{u}</option>
                  ))}
                </select>
              </Field>
              <Field label="For (optional)" htmlFor={`req-${i}-label`}>
                <input id={`req-${i}-label`} className={inputClass} placeholder="e.g. Study B, run sheet 1" {...register(`requirements.${i}.label`)} />
              </Field>
              <Button type="button" variant="secondary" onClick={() => remove(i)} disabled={fields.length === 1}>
                Remove
              </Button>
            </div>
          ))}
          <div className="flex gap-2">
            <Button type="button" variant="secondary" onClick={() => append({ chemicalId: "", amount: "", unit: "mmol", label: "" })}>
              Add a line
            </Button>
            <Button type="submit" disabled={formState.isSubmitting}>
              Check availability
            </Button>
          </div>
        </form>
        {message && <Banner tone={message.tone}>{message.text}</Banner>}
        {result && (
          <div className="flex flex-col gap-3" data-testid="availability-result">
            {result.shortfalls.length > 0 ? (
              <Banner tone="blocks" testId="shortfalls">
                <p className="font-medium">Short — order these before release:</p>
                <ul className="list-inside list-disc">
                  {result.shortfalls.map((s, i) => (
                    <li key={i}>
                      {s.name}: <span className="num">{Number(s.amount.toPrecision(6))} {s.unit}</span> short{s.label ? ` (${s.label})` : ""}
                    </li>
                  ))}
                </ul>
              </Banner>
            ) : (
              <Banner tone="ok">Everything is available.</Banner>
            )}
            {result.warnings.length > 0 && (
              <Banner tone="caution">
                <ul className="list-inside list-disc">
                  {result.warnings.map((w, i) => (
                    <li key={i}>{w.message}</li>
                  ))}
                </ul>
              </Banner>
            )}
            <table className="w-full text-sm">
              <thead>
                <tr className="border-b border-ink-line text-left text-ink-soft">
                  <th className="px-2 py-1 font-medium">Line</th>
                  <th className="px-2 py-1 font-medium">Chemical</th>
                  <th className="px-2 py-1 font-medium">Take from</th>
                </tr>
              </thead>
              <tbody>
                {result.lines.map((l) => (
                  <tr key={l.requirement} className="border-b border-ink-line/50 align-top">
                    <td className="px-2 py-1">{l.requirement + 1}</td>
                    <td className="px-2 py-1">{l.chemicalName}</td>
                    <td className="px-2 py-1">
                      {l.picks.length === 0 ? <span className="text-blocks">no usable container</span> : l.picks.map((p) => (
                        <div key={p.containerId}>
                          <span className="font-mono text-xs">{p.barcode}</span> · <span className="num">{p.display}</span>
                        </div>
                      ))}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            {canManage && result.lines.some((l) => l.picks.length > 0) && (
              <div className="flex flex-wrap items-end gap-2">
                <Field label="Plan reference" htmlFor="reserve-plan" hint="the plan's id; a shortfall does not stop a partial hold">
                  <input id="reserve-plan" className={inputClass} value={planRef} onChange={(e) => setPlanRef(e.target.value)} />
                </Field>
                <Button onClick={() => void reserve()} disabled={!planRef.trim()}>
                  Reserve the proposed amounts
                </Button>
              </div>
            )}
          </div>
        )}
      </section>
    </div>
  );
}
