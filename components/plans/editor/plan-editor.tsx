"use client";

/**
 * The plan editor (issue 10 item 4): the plan document in a react-hook-form form checked
 * with the document's own zod schema (check.ts), beside a live preview recomputed on the
 * server as the chemist types (lib/hooks/use-plan-preview.ts, POST /plans/preview).
 *
 * - Every issue shows on its field (form-paths.ts): the browser's, the server's 422s at
 *   `document.<path>` (preview and save), an infeasible plan's, an imported file's; the
 *   inventory's disagreements as warnings.
 * - Explicit save: POST for a new plan, PUT with the version it was loaded at for an edit;
 *   a 409 (someone else saved) keeps the chemist's edits and offers to save over theirs or
 *   to load theirs and re-apply.
 * - Unsaved changes: a warning before reload/close and before following a link.
 * - Import (validated, every problem on its field, undoable) and export of the document.
 * - The panel slot (editor-panels.tsx) for the safe-design alternatives.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import { useRouter } from "next/navigation";
import { FormProvider, useForm, useFormState } from "react-hook-form";
import type { ChemicalRow } from "@/inventory/schemas";
import type { PlanDocument, PlanDocumentInput } from "@/lib/chemistry/plan-document";
import type { FieldIssue } from "@/lib/errors/app-error";
import { getJson, postJson } from "@/lib/client/fetch-json";
import { useChemicals } from "@/lib/hooks/use-inventory";
import { usePlanPreview } from "@/lib/hooks/use-plan-preview";
import type { LabSettings } from "@/lib/lab-settings/schemas";
import type { PlanState } from "@/lib/plans/states";
import type { PlanView } from "@/lib/plans/view";
import { Banner } from "@/components/ui/banner";
import { Button, buttonClass } from "@/components/ui/button";
import { checkRawDocument, checkValues, editorResolver } from "./check";
import { ComponentsSection, type ComputedComponent } from "./components-section";
import { DesignSection, newSeed } from "./design-section";
import { EDITOR_PANELS } from "./editor-panels";
import { FactorsSection } from "./factors-section";
import { designValues, fromDocument, toDocument } from "./form-document";
import { FORM_LEVEL, SETTINGS_FIELD, placeIssues } from "./form-paths";
import { blankValues, type EditorValues } from "./form-values";
import { IssueContext, IssueStore } from "./issue-store";
import { useLeaveGuard } from "./leave-guard";
import { PreviewPanel } from "./preview-panel";
import { EquipmentSection, NameField, RecipeSection } from "./recipe-section";
import { SolventsSection, type KnownSolvent } from "./solvents-section";

export interface PlanEditorProps {
  labSlug: string;
  study: { id: string; name: string };
  settings: LabSettings;
  knownSolvents: readonly KnownSolvent[];
  chemicals: ChemicalRow[];
  /** The plan being edited, or null for a new one. */
  plan: { id: string; version: number; state: PlanState; name: string; document: PlanDocument } | null;
  /** A seed for a new plan's run order (drawn on the server, so the first render is the same in the browser). */
  seed: number;
}

/** Issues shown while the value they were found in is unchanged (an imported file's, a refused save's). */
interface HeldIssues {
  issues: FieldIssue[];
  /** The form values they were found in. */
  values: EditorValues;
}

const get = (o: unknown, path: string): unknown => (path === "" ? o : path.split(".").reduce<unknown>((x, k) => (x && typeof x === "object" ? (x as Record<string, unknown>)[k] : undefined), o));
const anyTrue = (node: unknown): boolean => node === true || (!!node && typeof node === "object" && Object.values(node as Record<string, unknown>).some(anyTrue));

function downloadJson(name: string, value: unknown) {
  const blob = new Blob([JSON.stringify(value, null, 2) + "\n"], { type: "application/json" });
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

const fileName = (name: string) => `${(name.trim() || "plan").replace(/[^\p{L}\p{N}]+/gu, "-").replace(/^-+|-+$/g, "").slice(0, 80) || "plan"}.plan.json`;

export function PlanEditor({ labSlug, study, settings, knownSolvents, chemicals: chemicalsFallback, plan, seed }: PlanEditorProps) {
  const router = useRouter();
  const initial = useMemo(
    () => (plan ? fromDocument(plan.document, settings, seed) : { values: blankValues({ vessel: settings.vessels.defaultId, block: settings.blocks.defaultId, seed }), notes: [] }),
    // The form starts once; later changes come from the form itself.
    [],
  );
  const resolver = useMemo(() => editorResolver(settings), [settings]);
  const form = useForm<EditorValues>({ defaultValues: initial.values, resolver, mode: "onSubmit", reValidateMode: "onSubmit", shouldFocusError: false });
  const { control, getValues, reset, watch, handleSubmit, setValue } = form;
  const { isDirty, dirtyFields, touchedFields, isSubmitting } = useFormState({ control });

  const chemicalsQuery = useChemicals(labSlug, chemicalsFallback);
  const chemicals = chemicalsQuery.data?.chemicals ?? chemicalsFallback;

  // ——— live check (the browser) ———
  const [checked, setChecked] = useState<{ document: Record<string, unknown>; issues: FieldIssue[]; values: EditorValues } | null>(null);
  const checkSeq = useRef(0);
  /** Typed since the last check: the preview is not of what the form shows. */
  const [typing, setTyping] = useState(false);
  const runCheck = useCallback(async () => {
    const mine = ++checkSeq.current;
    const values = structuredClone(getValues());
    const r = await checkValues(values, settings);
    if (mine === checkSeq.current) {
      setChecked({ ...r, values });
      setTyping(false);
    }
  }, [getValues, settings]);
  useEffect(() => {
    void runCheck();
    let timer: ReturnType<typeof setTimeout> | undefined;
    const sub = watch(() => {
      setTyping(true);
      clearTimeout(timer);
      timer = setTimeout(() => void runCheck(), 120);
    });
    return () => {
      clearTimeout(timer);
      sub.unsubscribe();
    };
  }, [watch, runCheck]);

  // ——— the preview (the server) ———
  const previewDocument = checked && checked.issues.length === 0 ? checked.document : null;
  const answered = usePlanPreview(labSlug, checked ? previewDocument : null);
  const preview = useMemo(() => (typing && answered.preview ? { ...answered, status: "computing" as const, stale: true } : answered), [typing, answered]);

  // ——— issues on fields ———
  const store = useMemo(() => new IssueStore(), []);
  const [showAll, setShowAll] = useState(plan !== null);
  const [held, setHeld] = useState<HeldIssues[]>([]);
  const [message, setMessage] = useState<{ tone: "blocks" | "ok" | "info" | "caution"; text: ReactNode } | null>(null);

  const placed = useMemo(() => {
    const values = checked?.values ?? getValues();
    const errors = new Map<string, string[]>();
    const add = (m: Map<string, string[]>) => {
      for (const [field, list] of m) errors.set(field, [...new Set([...(errors.get(field) ?? []), ...list])]);
    };
    const isShown = (field: string) => showAll || anyTrue(get(dirtyFields, field)) || anyTrue(get(touchedFields, field));
    const client = placeIssues(checked?.issues ?? [], values);
    add(new Map([...client].filter(([field]) => isShown(field))));
    // The server's answers stay on their fields until a newer answer replaces them (no flicker while typing).
    add(placeIssues(answered.issues, values));
    if (answered.preview?.problem && answered.status !== "waiting") add(placeIssues(answered.preview.problem.issues, values));
    for (const h of held) {
      const fresh = placeIssues(h.issues, h.values);
      add(new Map([...fresh].filter(([field]) => field === FORM_LEVEL || JSON.stringify(get(values, field)) === JSON.stringify(get(h.values, field)))));
    }
    const warnings = answered.preview ? placeIssues(answered.preview.inventoryIssues, values) : new Map<string, string[]>();
    return { errors, warnings, clientCount: client.size };
  }, [checked, answered, held, showAll, dirtyFields, touchedFields, getValues]);
  useEffect(() => store.replace(placed.errors, placed.warnings), [store, placed]);

  const focusFirst = useCallback(() => {
    setShowAll(true);
    requestAnimationFrame(() => {
      const first = [...store.entries()].find(([f, m]) => m.errors.length > 0 && f !== FORM_LEVEL);
      const el = first ? document.getElementById(first[0]) : null;
      el?.focus();
      el?.scrollIntoView({ block: "center" });
    });
  }, [store]);

  // ——— leaving with unsaved changes ———
  const [leaving, setLeaving] = useState<string | null>(null);
  const saved = useRef(false);
  useLeaveGuard(isDirty && !saved.current, setLeaving);

  // ——— saving ———
  const [version, setVersion] = useState(plan?.version ?? 0);
  const [conflict, setConflict] = useState<{ latest: PlanView; stash?: EditorValues } | null>(null);
  const save = handleSubmit(
    async (values) => {
      setMessage(null);
      const document = toDocument(values);
      const res = plan
        ? await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${plan.id}`, { document, version }, "PUT")
        : await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/studies/${study.id}/plans`, { document });
      if (res.ok) {
        saved.current = true;
        setHeld([]);
        router.push(`/labs/${labSlug}/studies/${study.id}/plans/${res.data.plan.id}?saved=${res.data.plan.version}`);
        return;
      }
      if (res.status === 422) {
        setHeld((h) => [...h, { issues: res.error.issues, values: structuredClone(values) }]);
        setShowAll(true);
        setMessage({ tone: "blocks", text: `Not saved: ${res.error.message} The problems are marked on their fields.` });
        focusFirst();
        return;
      }
      if (res.status === 409 && plan && res.error.issues.some((i) => i.path === "version")) {
        const latest = await getJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${plan.id}`).catch(() => null);
        if (latest) setConflict({ latest: latest.plan });
        setMessage({ tone: "caution", text: "Not saved: someone else saved this plan while you were editing. Your edits are still here." });
        return;
      }
      setMessage({ tone: "blocks", text: `Not saved: ${res.error.message}` });
    },
    () => {
      setMessage({ tone: "blocks", text: "Not saved: some fields need attention (marked in red)." });
      focusFirst();
    },
  );

  // ——— import and export ———
  const fileInput = useRef<HTMLInputElement>(null);
  const [undoImport, setUndoImport] = useState<EditorValues | null>(null);
  const [notes, setNotes] = useState<string[]>(initial.notes);

  const onImportFile = async (file: File) => {
    setMessage(null);
    let raw: unknown;
    try {
      raw = JSON.parse(await file.text());
    } catch (e) {
      setMessage({ tone: "blocks", text: `Nothing imported: ${file.name} is not JSON (${(e as Error).message}). The plan in the editor is unchanged.` });
      return;
    }
    if (!raw || typeof raw !== "object" || Array.isArray(raw)) {
      setMessage({ tone: "blocks", text: `Nothing imported: ${file.name} is not a plan document (a JSON object). The plan in the editor is unchanged.` });
      return;
    }
    const before = structuredClone(getValues());
    const { values, notes: importNotes } = fromDocument(raw, settings, newSeed());
    // The file's own problems (unknown keys, wrong types), found by the same schema, placed on the form's fields.
    const own = await checkValues(values, settings);
    const rawIssues = checkRawDocument(raw as Record<string, unknown>, settings);
    reset(values, { keepDefaultValues: true });
    setHeld([{ issues: rawIssues, values: structuredClone(values) }]);
    setShowAll(true);
    setNotes(importNotes);
    setUndoImport(before);
    const problems = new Set([...rawIssues, ...own.issues].map((i) => i.path)).size;
    setMessage({
      tone: problems ? "caution" : "ok",
      text: problems ? `Imported ${file.name}: ${problems} ${problems === 1 ? "field needs" : "fields need"} attention, marked on the form. Nothing is saved until you save.` : `Imported ${file.name}. Nothing is saved until you save.`,
    });
  };

  const onExport = () => {
    const fresh = preview.status === "ready" && !preview.stale && preview.preview;
    downloadJson(fileName(getValues("name")), fresh ? preview.preview!.document : toDocument(getValues()));
  };

  // ——— the panel slot: a panel puts a new design and factors into the form ———
  const onApply = useCallback(
    (design: PlanDocumentInput["design"], factors: PlanDocumentInput["factors"]) => {
      const base = getValues("design");
      const dv = designValues(design, base);
      const { values } = fromDocument({ ...toDocument(getValues()), design, factors }, settings, base.seed ?? newSeed());
      setValue("factors", values.factors, { shouldDirty: true });
      setValue("design", dv.design, { shouldDirty: true });
      setValue("carry", { ...getValues("carry"), designExtra: dv.extra, givenRuns: dv.givenRuns, modelTerms: dv.modelTerms }, { shouldDirty: true });
    },
    [getValues, setValue, settings],
  );

  const computed = useMemo(() => {
    const m = new Map<string, ComputedComponent>();
    for (const c of preview.preview?.runSheet?.components ?? []) m.set(c.id, { molarMassGPerMol: c.molarMassGPerMol, dispensedAs: c.dispensedAs, source: c.source });
    return m;
  }, [preview.preview]);

  const factorsForTable = useMemo(() => (preview.preview?.document.factors ?? []).map((f) => ({ name: f.name, unit: f.unit })), [preview.preview]);
  const formLevel = placed.errors.get(FORM_LEVEL) ?? [];
  const settingsIssues = placed.errors.get(SETTINGS_FIELD) ?? [];
  const settingsHref = `/labs/${labSlug}/settings`;
  const studyHref = `/labs/${labSlug}/studies/${study.id}`;

  return (
    <FormProvider {...form}>
      <IssueContext.Provider value={store}>
        <div className="flex flex-col gap-5" data-testid="plan-editor">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <div className="min-w-0">
              <p className="text-sm uppercase tracking-wide text-ink-faint">
                <a href={studyHref}>{study.name}</a> · {plan ? "edit plan" : "new plan"}
              </p>
              <h1>{plan ? plan.name : "New plan"}</h1>
              <p className="mt-1 text-sm text-ink-soft" data-testid="dirty-state">
                {isDirty ? "Unsaved changes" : plan ? <span className="num">Saved · version {version}</span> : "Not saved yet"}
              </p>
            </div>
            <div className="flex flex-wrap gap-2">
              <input
                ref={fileInput}
                type="file"
                accept="application/json,.json"
                className="sr-only"
                aria-label="Import a plan document (JSON)"
                data-testid="import-file"
                onChange={(e) => {
                  const f = e.target.files?.[0];
                  e.target.value = "";
                  if (f) void onImportFile(f);
                }}
              />
              <Button type="button" variant="secondary" onClick={() => fileInput.current?.click()}>
                Import JSON
              </Button>
              <Button type="button" variant="secondary" onClick={onExport} data-testid="export-json">
                Export JSON
              </Button>
              <Button type="button" onClick={() => void save()} disabled={isSubmitting} data-testid="save-plan">
                {isSubmitting ? "Saving…" : plan ? "Save changes" : "Save plan"}
              </Button>
            </div>
          </div>

          {message && (
            <Banner tone={message.tone} testId="editor-message">
              {message.text}
              {undoImport && (
                <>
                  {" "}
                  <button
                    type="button"
                    className="font-medium underline"
                    onClick={() => {
                      reset(undoImport, { keepDefaultValues: true });
                      setUndoImport(null);
                      setHeld([]);
                      setNotes(initial.notes);
                      setMessage({ tone: "info", text: "The import was undone." });
                    }}
                  >
                    Undo the import
                  </button>
                </>
              )}
            </Banner>
          )}
          {conflict && (
            <Banner tone="caution" testId="save-conflict">
              <p>
                <strong>
                  Version <span className="num">{conflict.latest.version}</span>
                </strong>{" "}
                was saved by {conflict.latest.authorName || "someone else"} after you opened the plan (you started from version <span className="num">{plan?.version}</span>).
              </p>
              <div className="mt-2 flex flex-wrap gap-2">
                {!conflict.stash ? (
                  <>
                    <Button
                      type="button"
                      variant="secondary"
                      onClick={() => {
                        setVersion(conflict.latest.version);
                        setConflict(null);
                        setMessage({ tone: "info", text: `Your edits are kept. Save now to replace version ${conflict.latest.version} with them.` });
                      }}
                    >
                      Keep my edits (save over theirs)
                    </Button>
                    <Button
                      type="button"
                      variant="secondary"
                      onClick={() => {
                        const stash = structuredClone(getValues());
                        const theirs = fromDocument(conflict.latest.document, settings, newSeed());
                        reset(theirs.values);
                        setVersion(conflict.latest.version);
                        setConflict({ latest: conflict.latest, stash });
                        setMessage({ tone: "info", text: `Their version ${conflict.latest.version} is loaded. Your edits are kept: re-apply them to save them on top.` });
                      }}
                    >
                      Load their version
                    </Button>
                  </>
                ) : (
                  <Button
                    type="button"
                    variant="secondary"
                    onClick={() => {
                      reset(conflict.stash, { keepDefaultValues: true });
                      setConflict(null);
                      setMessage({ tone: "info", text: `Your edits are back on top of version ${conflict.latest.version}; save to keep them.` });
                    }}
                  >
                    Re-apply my edits
                  </Button>
                )}
              </div>
            </Banner>
          )}
          {notes.length > 0 && (
            <Banner tone="info" testId="editor-notes">
              <ul className="flex flex-col gap-1">
                {notes.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            </Banner>
          )}
          {formLevel.length > 0 && (
            <Banner tone="blocks" testId="error-form">
              <ul className="flex flex-col gap-1">
                {formLevel.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            </Banner>
          )}

          <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1.05fr)]">
            <FormBody labSlug={labSlug} settings={settings} settingsHref={settingsHref} chemicals={chemicals} chemicalsLoading={chemicalsQuery.isLoading && chemicals.length === 0} knownSolvents={knownSolvents} computed={computed} onSubmit={() => void save()} />
            <aside className="flex flex-col gap-4 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto xl:pr-1" aria-label="Preview and checks">
              {/* The panel slot (editor-panels.tsx): e.g. the safe-design alternatives. */}
              {EDITOR_PANELS.map(({ id, Panel }) => (
                <div key={id} data-testid={`editor-panel-${id}`}>
                  <Panel labSlug={labSlug} document={previewDocument} preview={preview.preview} status={preview.status} stale={preview.stale} onApply={onApply} />
                </div>
              ))}
              <PreviewPanel state={preview} factors={factorsForTable} waitingCount={placed.clientCount} onShowProblems={focusFirst} settingsHref={settingsHref} settingsIssues={settingsIssues} />
            </aside>
          </div>

          {leaving !== null && (
            <LeaveDialog
              onStay={() => setLeaving(null)}
              onLeave={() => {
                const href = leaving;
                saved.current = true;
                setLeaving(null);
                router.push(href);
              }}
            />
          )}
        </div>
      </IssueContext.Provider>
    </FormProvider>
  );
}

/** The form's sections; memoised so the preview's updates do not re-render every field. */
const FormBody = memo(function FormBody({
  labSlug,
  settings,
  settingsHref,
  chemicals,
  chemicalsLoading,
  knownSolvents,
  computed,
  onSubmit,
}: {
  labSlug: string;
  settings: LabSettings;
  settingsHref: string;
  chemicals: readonly ChemicalRow[];
  chemicalsLoading: boolean;
  knownSolvents: readonly KnownSolvent[];
  computed: ReadonlyMap<string, ComputedComponent>;
  onSubmit: () => void;
}) {
  return (
    <form
      noValidate
      className="flex min-w-0 flex-col gap-6"
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
      data-testid="plan-form"
    >
      <NameField />
      <RecipeSection />
      <ComponentsSection labSlug={labSlug} chemicals={chemicals} chemicalsLoading={chemicalsLoading} computed={computed} />
      <SolventsSection chemicals={chemicals} knownSolvents={knownSolvents} />
      <FactorsSection />
      <DesignSection />
      <EquipmentSection settings={settings} settingsHref={settingsHref} />
    </form>
  );
});

function LeaveDialog({ onStay, onLeave }: { onStay: () => void; onLeave: () => void }) {
  const stay = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    stay.current?.focus();
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && onStay();
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [onStay]);
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/30 p-4">
      <div role="alertdialog" aria-modal="true" aria-labelledby="leave-title" aria-describedby="leave-text" className="w-full max-w-md rounded-lg border border-ink-line bg-paper-card p-5 shadow-xl" data-testid="leave-dialog">
        <h2 id="leave-title">Leave without saving?</h2>
        <p id="leave-text" className="mt-2 text-sm text-ink-soft">
          The plan has unsaved changes. If you leave now they are lost; export it as JSON first if you want to keep a copy.
        </p>
        <div className="mt-4 flex justify-end gap-2">
          <button ref={stay} type="button" className={buttonClass("secondary")} onClick={onStay}>
            Stay and keep editing
          </button>
          <Button type="button" variant="danger" onClick={onLeave}>
            Leave and lose the changes
          </Button>
        </div>
      </div>
    </div>
  );
}
