"use client";

/**
 * THE EDITOR'S PANEL SLOT. Panels listed in `EDITOR_PANELS` are mounted in the plan
 * editor's preview column, above the preview's tabs, in this order. Each receives the
 * document as the form holds it now, the latest preview of it (run sheet, cautions, the
 * stored document with the lab's values), the preview's state, and `onApply`, which puts a
 * new design section and factor list into the form (the chemist still saves explicitly).
 *
 * Registered: the safe-design alternatives panel (components/plans/safe-design/**). A panel
 * with nothing to say renders null.
 */
import type { ComponentType } from "react";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import type { PreviewStatus } from "@/lib/hooks/use-plan-preview";
import type { PlanPreview } from "@/lib/plans/preview";
import { SafeDesignPanel } from "../safe-design/safe-design-panel";

export interface EditorPanelProps {
  labSlug: string;
  /** The plan document as the form holds it (vessel and block as lab ids; no lab settings), or null while it has errors the browser found. */
  document: Record<string, unknown> | null;
  /** The latest preview (it may be of an older document: see `stale`). */
  preview: PlanPreview | null;
  status: PreviewStatus;
  stale: boolean;
  /** Replaces the form's design section and factors (e.g. with a safe alternative); marks the form as changed. */
  onApply: (design: PlanDocumentInput["design"], factors: PlanDocumentInput["factors"]) => void;
}

export interface EditorPanel {
  id: string;
  Panel: ComponentType<EditorPanelProps>;
}

/** The panels mounted in the editor (see the module comment). */
export const EDITOR_PANELS: readonly EditorPanel[] = [{ id: "safe-design", Panel: SafeDesignPanel }];
