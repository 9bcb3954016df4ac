"use client";

import { useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { chemicalFormSchema, chemicalFromForm, type ChemicalFormInput, type ChemicalRow } from "@/inventory/schemas";
import { postJson } from "@/lib/client/fetch-json";
import { changedFields } from "@/lib/client/changed-fields";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ChemicalFields, chemicalFormValues, showChemicalIssues } from "./chemical-form";

type FormOutput = z.output<typeof chemicalFormSchema>;
/** The version the row was read at, when the API sends one (optimistic concurrency). */
type Versioned = ChemicalRow & { version?: number };

/**
 * Edits one chemical in a modal dialog. Sends only the fields the person changed, with the
 * version it read when the API gives one; a 409 says someone else changed the chemical
 * meanwhile and offers to reload it (the parent then mounts it afresh with the newer record).
 */
export function ChemicalEditDialog({ labSlug, chemical, onClose, onSaved, onReload }: { labSlug: string; chemical: Versioned; onClose: () => void; onSaved: (name: string) => void; onReload: () => Promise<void> }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [problem, setProblem] = useState<{ text: string; stale: boolean } | null>(null);
  const initial = chemicalFormValues(chemical);
  const { register, handleSubmit, formState, setError } = useForm<ChemicalFormInput, unknown, FormOutput>({ resolver: zodResolver(chemicalFormSchema), defaultValues: initial });

  useEffect(() => {
    const d = dialog.current;
    if (d && !d.open) d.showModal();
  }, []);

  const onSubmit = handleSubmit(async (values) => {
    setProblem(null);
    const before = chemicalFromForm(chemicalFormSchema.parse(chemicalFormValues(chemical)));
    const patch = changedFields(before as Record<string, unknown>, chemicalFromForm(values) as Record<string, unknown>);
    if (Object.keys(patch).length === 0) {
      onClose();
      return;
    }
    const body = chemical.version === undefined ? patch : { ...patch, version: chemical.version };
    const res = await postJson(`/api/labs/${labSlug}/chemicals/${chemical.id}`, body, "PATCH");
    if (res.ok) {
      onSaved(values.name);
      return;
    }
    if (res.status === 409 && (res.error.issues.some((i) => i.path === "version") || !res.error.issues.length)) {
      setProblem({ text: "Someone else changed this chemical since you opened it. Reload to see their changes, then make yours again.", stale: true });
      return;
    }
    const rest = showChemicalIssues(res.error.issues, setError);
    setProblem({ text: rest.length ? `${res.error.message} ${rest.map((i) => `${i.path}: ${i.message}`).join("; ")}` : res.error.message, stale: false });
  });

  return (
    <dialog
      ref={dialog}
      onClose={onClose}
      aria-labelledby="chemical-edit-title"
      className="m-auto w-[min(64rem,calc(100vw-2rem))] rounded-lg border border-ink-line bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40"
      data-testid="chemical-edit"
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 p-5">
        <div className="flex items-start justify-between gap-3">
          <div>
            <h2 id="chemical-edit-title">Edit {chemical.name}</h2>
            <p className="text-sm text-ink-soft">Only the fields you change are saved; every change is recorded in the audit log.</p>
          </div>
          <button type="button" className="rounded-md px-2 py-1 text-ink-soft hover:bg-paper-deep" aria-label="Close" onClick={() => dialog.current?.close()}>
            ✕
          </button>
        </div>
        {problem && (
          <Banner tone={problem.stale ? "caution" : "blocks"} testId="chemical-edit-problem">
            <span>{problem.text}</span>
            {problem.stale && (
              <button type="button" className="ml-2 font-medium text-accent underline underline-offset-2" onClick={() => void onReload()}>
                Reload
              </button>
            )}
          </Banner>
        )}
        <ChemicalFields register={register} errors={formState.errors} idPrefix="edit" />
        <div className="flex gap-2">
          <Button type="submit" disabled={formState.isSubmitting}>
            Save changes
          </Button>
          <Button type="button" variant="secondary" onClick={() => dialog.current?.close()}>
            Cancel
          </Button>
        </div>
      </form>
    </dialog>
  );
}
