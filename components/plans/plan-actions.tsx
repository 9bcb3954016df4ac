"use client";

/**
 * The plan page's own actions: Edit (for the states that take an edit), Duplicate (a new
 * draft of the same study), Export JSON (the stored document, which `npm run -s cli -- plan`
 * and the editor's import read) and Delete (drafts only, after a confirmation).
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import { postJson } from "@/lib/client/fetch-json";
import type { PlanView } from "@/lib/plans/view";
import { Banner } from "@/components/ui/banner";
import { Button, buttonClass } from "@/components/ui/button";

function download(name: string, document: PlanDocument) {
  const blob = new Blob([JSON.stringify(document, null, 2) + "\n"], { type: "application/json" });
  const url = URL.createObjectURL(blob);
  const a = window.document.createElement("a");
  a.href = url;
  a.download = name;
  window.document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function PlanActions({
  labSlug,
  plan,
  canEdit,
  editable,
  deletable,
}: {
  labSlug: string;
  plan: Pick<PlanView, "id" | "studyId" | "name" | "version" | "document">;
  /** The viewer may edit plans (chemists, lab admins). */
  canEdit: boolean;
  /** The plan's state takes an edit. */
  editable: boolean;
  /** The plan's state can be deleted (drafts). */
  deletable: boolean;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const base = `/labs/${labSlug}/studies/${plan.studyId}`;

  const duplicate = async () => {
    setBusy(true);
    setError(null);
    const res = await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${plan.id}/duplicate`, {});
    setBusy(false);
    if (!res.ok) return setError(res.error.message);
    router.push(`${base}/plans/${res.data.plan.id}`);
  };
  const remove = async () => {
    setBusy(true);
    setError(null);
    const res = await postJson<{ deleted: string }>(`/api/labs/${labSlug}/plans/${plan.id}?version=${plan.version}`, undefined, "DELETE");
    setBusy(false);
    if (!res.ok) {
      setConfirmDelete(false);
      return setError(res.error.message);
    }
    router.push(base);
  };

  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3" aria-label="Plan actions" data-testid="plan-actions">
      {canEdit && editable && (
        <Link href={`${base}/plans/${plan.id}/edit`} className={buttonClass("primary")} data-testid="edit-plan">
          Edit
        </Link>
      )}
      {canEdit && (
        <Button type="button" variant="secondary" onClick={() => void duplicate()} disabled={busy} data-testid="duplicate-plan">
          Duplicate
        </Button>
      )}
      <Button type="button" variant="secondary" onClick={() => download(`${plan.name.replace(/[^\p{L}\p{N}]+/gu, "-").replace(/^-+|-+$/g, "") || "plan"}.plan.json`, plan.document)} data-testid="export-plan">
        Export JSON
      </Button>
      {canEdit && deletable && !confirmDelete && (
        <Button type="button" variant="danger" onClick={() => setConfirmDelete(true)} disabled={busy} data-testid="delete-plan">
          Delete draft
        </Button>
      )}
      {confirmDelete && (
        <div className="flex flex-col gap-2 rounded-md border border-blocks/30 bg-blocks-bg p-2 text-sm text-blocks" data-testid="delete-confirm">
          <p>Delete this draft for good? Its history stays in the audit log.</p>
          <div className="flex gap-2">
            <Button type="button" variant="danger" onClick={() => void remove()} disabled={busy}>
              Delete
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirmDelete(false)}>
              Keep it
            </Button>
          </div>
        </div>
      )}
      {error && <Banner tone="blocks">{error}</Banner>}
    </section>
  );
}
