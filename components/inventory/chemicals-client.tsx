"use client";

import { useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { chemicalFormSchema, chemicalFromForm, type ChemicalFormInput, type ChemicalRow } from "@/inventory/schemas";
import { useChemicals } from "@/lib/hooks/use-inventory";
import { postJson } from "@/lib/client/fetch-json";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { Amount } from "./bits";
import { ChemicalFields, EMPTY_CHEMICAL_FORM, showChemicalIssues } from "./chemical-form";
import { ChemicalEditDialog } from "./chemical-edit-dialog";
import { impliedHazards } from "@/lib/hazards/hazard-flags";

const col = tableColumns<ChemicalRow>();

type FormOutput = z.output<typeof chemicalFormSchema>;

function NewChemicalForm({ labSlug, onCreated }: { labSlug: string; onCreated: () => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<ChemicalFormInput, unknown, FormOutput>({ resolver: zodResolver(chemicalFormSchema), defaultValues: EMPTY_CHEMICAL_FORM });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson(`/api/labs/${labSlug}/chemicals`, chemicalFromForm(values));
    if (!res.ok) {
      showChemicalIssues(res.error.issues, setError);
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
      <ChemicalFields register={register} errors={formState.errors} idPrefix="ch" />
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
          <button type="button" className="text-accent underline-offset-2 hover:underline" onClick={() => input.current?.click()}>
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
  // The record as read when editing began (a background refresh does not change it under the
  // person's hands); `n` counts reloads, so a reload shows the newer record.
  const [editing, setEditing] = useState<{ row: ChemicalRow; n: number } | null>(null);
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
          <PeroxideTag ghs={row.original.ghsStatements} peroxideClass={row.original.peroxideClass} />
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
    ...(canManage
      ? [
          col.display({
            id: "edit",
            header: () => <span className="sr-only">Edit</span>,
            cell: ({ row }) => (
              <Button variant="secondary" onClick={() => setEditing({ row: row.original, n: 0 })} aria-label={`Edit ${row.original.name}`} data-testid={`edit-${row.original.name}`}>
                Edit
              </Button>
            ),
          }),
        ]
      : []),
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
      {editing && (
        <ChemicalEditDialog
          key={`${editing.row.id}-${editing.n}`}
          labSlug={labSlug}
          chemical={editing.row}
          onClose={() => setEditing(null)}
          onSaved={(name) => {
            setEditing(null);
            setMessage({ tone: "ok", text: `${name} saved.` });
            void mutate();
          }}
          onReload={async () => {
            const fresh = (await mutate())?.chemicals.find((c) => c.id === editing.row.id);
            setEditing(fresh ? { row: fresh, n: editing.n + 1 } : null);
          }}
        />
      )}
    </div>
  );
}

/** The peroxide-former tag: the declared class, or "class not given" for EUH019 alone (lib/hazards/hazard-flags is the rule). */
function PeroxideTag({ ghs, peroxideClass }: { ghs: string[]; peroxideClass: ChemicalRow["peroxideClass"] }) {
  const former = impliedHazards({ ghs, peroxideClass }).peroxideClass;
  if (!former) return null;
  return <span className="rounded bg-caution-bg px-1.5 text-xs text-caution">{former === "unclassified" ? "peroxide, class not given" : `peroxide ${former}`}</span>;
}
