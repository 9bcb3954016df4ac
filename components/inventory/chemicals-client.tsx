"use client";

import { useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { chemicalFormSchema, chemicalFromForm, PEROXIDE_CLASSES, PHYSICAL_STATES, type ChemicalFormInput, type ChemicalRow } from "@/inventory/schemas";
import { useChemicals } from "@/lib/hooks/use-inventory";
import { postJson } from "@/lib/client/fetch-json";
import { STOCK_UNITS } from "@/inventory/units";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Amount } from "./bits";

const col = tableColumns<ChemicalRow>();

type FormOutput = z.output<typeof chemicalFormSchema>;
const PATH_TO_FIELD: Record<string, keyof ChemicalFormInput> = { name: "name", cas: "cas", formula: "formula", molarMass: "molarMass", density: "density", physicalState: "physicalState", peroxideClass: "peroxideClass", storageNotes: "storageNotes", "lowStock.amount": "lowAmount", "lowStock.unit": "lowUnit" };

function NewChemicalForm({ labSlug, onCreated }: { labSlug: string; onCreated: () => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<ChemicalFormInput, unknown, FormOutput>({
    resolver: zodResolver(chemicalFormSchema),
    defaultValues: { name: "", cas: "", formula: "", molarMass: "", density: "", physicalState: "solid", ghs: "", peroxideClass: "", pyrophoric: false, waterReactive: false, storageNotes: "", lowAmount: "", lowUnit: "g" },
  });
  const err = (k: keyof ChemicalFormInput) => formState.errors[k]?.message;
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson(`/api/labs/${labSlug}/chemicals`, chemicalFromForm(values));
    if (!res.ok) {
      for (const i of res.error.issues) {
        const f = PATH_TO_FIELD[i.path];
        if (f) setError(f, { message: i.message });
        else if (i.path.startsWith("ghsStatements")) setError("ghs", { message: i.message });
      }
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    setMessage({ tone: "ok", text: `${values.name} added to the catalogue.` });
    reset();
    onCreated();
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="Name" htmlFor="ch-name" error={err("name")}>
          <input id="ch-name" className={inputClass} {...register("name")} />
        </Field>
        <Field label="CAS number" htmlFor="ch-cas" error={err("cas")} hint="checked by its check digit">
          <input id="ch-cas" className={`${inputClass} num`} placeholder="7732-18-5" {...register("cas")} />
        </Field>
        <Field label="Formula" htmlFor="ch-formula" error={err("formula")}>
          <input id="ch-formula" className={inputClass} {...register("formula")} />
        </Field>
        <Field label="Physical state" htmlFor="ch-state" error={err("physicalState")}>
          <select id="ch-state" className={inputClass} {...register("physicalState")}>
            {PHYSICAL_STATES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </Field>
        <Field label="Molar mass (g/mol)" htmlFor="ch-mm" error={err("molarMass")}>
          <input id="ch-mm" inputMode="decimal" className={`${inputClass} num`} {...register("molarMass")} />
        </Field>
        <Field label="Density (g/mL)" htmlFor="ch-density" error={err("density")}>
          <input id="ch-density" inputMode="decimal" className={`${inputClass} num`} {...register("density")} />
        </Field>
        <Field label="GHS statements" htmlFor="ch-ghs" error={err("ghs")} hint="e.g. H225 H319 EUH019">
          <input id="ch-ghs" className={inputClass} {...register("ghs")} />
        </Field>
        <Field label="Peroxide-former class" htmlFor="ch-perox" error={err("peroxideClass")}>
          <select id="ch-perox" className={inputClass} {...register("peroxideClass")}>
            <option value="">not a peroxide former</option>
            {PEROXIDE_CLASSES.map((c) => (
              <option key={c} value={c}>
                class {c}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Low-stock mark" htmlFor="ch-low" error={err("lowAmount") ?? err("lowUnit")}>
          <div className="flex gap-2">
            <input id="ch-low" inputMode="decimal" className={`${inputClass} num w-full`} {...register("lowAmount")} />
            <select aria-label="Low-stock unit" className={inputClass} {...register("lowUnit")}>
              {STOCK_UNITS.map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </div>
        </Field>
        <Field label="Storage notes" htmlFor="ch-notes" error={err("storageNotes")}>
          <input id="ch-notes" className={inputClass} {...register("storageNotes")} />
        </Field>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("pyrophoric")} /> pyrophoric (H250)
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("waterReactive")} /> water-reactive (H260/H261)
        </label>
      </div>
      <div>
        <Button type="submit" disabled={formState.isSubmitting}>
          Add chemical
        </Button>
      </div>
    </form>
  );
}

function SdsCell({ labSlug, chem, canManage, onDone }: { labSlug: string; chem: ChemicalRow; canManage: boolean; onDone: (msg: { tone: "ok" | "blocks"; text: string }) => void }) {
  const input = useRef<HTMLInputElement>(null);
  async function upload(file: File) {
    const form = new FormData();
    form.set("file", file);
    const res = await fetch(`/api/labs/${labSlug}/chemicals/${chem.id}/sds`, { method: "POST", body: form });
    const body = (await res.json().catch(() => null)) as { error?: { message: string } } | null;
    onDone(res.ok ? { tone: "ok", text: `Safety data sheet for ${chem.name} saved.` } : { tone: "blocks", text: body?.error?.message ?? `Upload failed (${res.status}).` });
  }
  return (
    <div className="flex items-center gap-2 text-xs">
      {chem.sds ? (
        <a href={`/api/labs/${labSlug}/chemicals/${chem.id}/sds`}>
          PDF <span className="num">{(chem.sds.sizeBytes / 1024).toFixed(0)} kB</span>
        </a>
      ) : (
        <span className="text-ink-faint">none</span>
      )}
      {canManage && (
        <>
          <input ref={input} type="file" accept="application/pdf,.pdf" className="hidden" aria-label={`Safety data sheet for ${chem.name}`} onChange={(e) => e.target.files?.[0] && void upload(e.target.files[0])} />
          <button type="button" className="text-copper-dark underline-offset-2 hover:underline" onClick={() => input.current?.click()}>
            {chem.sds ? "replace" : "upload"}
          </button>
        </>
      )}
    </div>
  );
}

export function ChemicalsClient({ labSlug, canManage, initial }: { labSlug: string; canManage: boolean; initial: ChemicalRow[] }) {
  const { data, mutate, error } = useChemicals(labSlug, initial);
  const [filter, setFilter] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const all = data?.chemicals ?? initial;
  const f = filter.trim().toLowerCase();
  const rows = f ? all.filter((c) => c.name.toLowerCase().includes(f) || (c.cas ?? "").includes(f) || (c.formula ?? "").toLowerCase().includes(f)) : all;
  const columns = col.columns([
    col.accessor("name", { header: "Name", cell: (i) => <span className="font-medium">{i.getValue()}</span> }),
    col.accessor("cas", { header: "CAS", cell: (i) => <span className="num whitespace-nowrap">{i.getValue() ?? "—"}</span> }),
    col.accessor("formula", { header: "Formula", cell: (i) => i.getValue() ?? "—" }),
    col.accessor("molarMass", { header: "M (g/mol)", cell: (i) => <span className="num">{i.getValue() ? Number(i.getValue()) : "—"}</span> }),
    col.accessor("density", { header: "ρ (g/mL)", cell: (i) => <span className="num">{i.getValue() ? Number(i.getValue()) : "—"}</span> }),
    col.display({
      id: "hazards",
      header: "Hazards",
      cell: ({ row }) => (
        <div className="flex max-w-56 flex-wrap gap-1">
          {row.original.pyrophoric && <span className="rounded bg-blocks-bg px-1.5 text-xs text-blocks">pyrophoric</span>}
          {row.original.waterReactive && <span className="rounded bg-blocks-bg px-1.5 text-xs text-blocks">water-reactive</span>}
          {row.original.peroxideClass && <span className="rounded bg-caution-bg px-1.5 text-xs text-caution">peroxide {row.original.peroxideClass}</span>}
          <span className="text-xs text-ink-faint">{row.original.ghsStatements.join(" ")}</span>
        </div>
      ),
    }),
    col.display({
      id: "onHand",
      header: "On hand",
      cell: ({ row }) => (
        <div className="flex flex-col">
          {row.original.onHand.length === 0 ? <span className="text-ink-faint">none</span> : row.original.onHand.map((a) => <Amount key={a.dimension} value={a} />)}
          <span className="num text-xs text-ink-faint">
            {row.original.containerCount} container{row.original.containerCount === 1 ? "" : "s"}
          </span>
        </div>
      ),
    }),
    col.accessor("lowStock", { header: "Low-stock mark", cell: (i) => <Amount value={i.getValue()} /> }),
    col.display({ id: "sds", header: "SDS", cell: ({ row }) => <SdsCell labSlug={labSlug} chem={row.original} canManage={canManage} onDone={(m) => (setMessage(m), void mutate())} /> }),
  ]);
  return (
    <div className="flex flex-col gap-4">
      {canManage && (
        <details className="rounded-lg border border-ink-line bg-paper-card p-4">
          <summary className="cursor-pointer text-sm font-medium">Add a chemical</summary>
          <div className="mt-3">
            <NewChemicalForm labSlug={labSlug} onCreated={() => void mutate()} />
          </div>
        </details>
      )}
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      {error && <Banner tone="blocks">{(error as Error).message}</Banner>}
      <input type="search" className={`${inputClass} max-w-md`} placeholder="Filter by name, CAS or formula" value={filter} onChange={(e) => setFilter(e.target.value)} aria-label="Filter chemicals" />
      <DataTable columns={columns} data={rows} rowId={(r) => r.id} testId="chemicals" empty={f ? "No chemical matches." : "The catalogue is empty."} />
    </div>
  );
}
