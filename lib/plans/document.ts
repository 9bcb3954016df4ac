/**
 * The stored form of a plan document. What a plan stores is the document as the engine's
 * own schema (`planDocumentSchema`) validated and defaulted it, after
 *
 * 1. SMILES-only components get their formula (the `plan` verb's `resolvePlanSmiles`);
 * 2. what the document does not give is taken from the lab's settings (`withLabDefaults`):
 *    the vessel type (a lab vessel id is expanded into the full vessel type), the block
 *    and the temperature limits it sets (`equipment`), the dispensing limits and the hazard
 *    thresholds, field by field;
 * 3. a randomised design without a seed gets one, so the run order is fixed with the plan.
 *
 * The content hash is taken over this form, so it covers every value the run sheet and
 * the cautions are computed from, and the stored document runs unchanged through
 * `npm run -s cli -- plan`. Storing it again (export → import) changes nothing: every
 * step above leaves a stored document as it is.
 */
import { AppError } from "../errors/app-error";
import { planDocumentSchema, type PlanDocument } from "../chemistry/plan-document";
import { resolvePlanSmiles } from "../chemistry/smiles";
import { findDefaultVessel } from "../hazards/vessels";
import type { LabSettings } from "../lab-settings/schemas";
import { contentHash } from "./content-hash";

/** Where request paths of the document start. */
export const DOCUMENT_PATH = "document";

/** Re-throws an invalid-input error with its issue paths under `document.` (what the person sent). */
export function underDocument(e: unknown): never {
  if (e instanceof AppError && (e.code === "invalid_input" || e.code === "infeasible")) {
    const issues = e.issues.map((i) => ({ ...i, path: i.path ? `${DOCUMENT_PATH}.${i.path}` : DOCUMENT_PATH }));
    throw new AppError(e.code, e.message, issues.length ? issues : [{ path: DOCUMENT_PATH, message: e.message }]);
  }
  throw e;
}

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === "object" && !Array.isArray(v);

/**
 * Fills in what a raw plan document does not give from the lab's settings (see the module
 * comment). A `vessel` or `block` given as a string names one of the lab's vessel types
 * or blocks; a block named that way also sets the temperature limits (`equipment`) unless
 * the document gives them. Values the document gives always win.
 * @throws AppError("invalid_input") at `vessel` or `block` for an id the lab does not have.
 */
export function withLabDefaults(raw: Record<string, unknown>, settings: LabSettings): Record<string, unknown> {
  const doc: Record<string, unknown> = { ...raw };

  if (doc.vessel === undefined || typeof doc.vessel === "string") {
    const id = (doc.vessel as string | undefined) ?? settings.vessels.defaultId;
    const vessel = settings.vessels.types.find((v) => v.id === id) ?? findDefaultVessel(id);
    if (!vessel) {
      throw AppError.field("vessel", `names no vessel type of the lab (${settings.vessels.types.map((v) => v.id).join(", ")})`);
    }
    doc.vessel = { ...vessel };
  }

  let block: LabSettings["blocks"]["types"][number] | undefined;
  if (doc.block === undefined || typeof doc.block === "string") {
    const id = (doc.block as string | undefined) ?? settings.blocks.defaultId;
    block = settings.blocks.types.find((b) => b.id === id);
    if (!block) throw AppError.field("block", `names no block of the lab (${settings.blocks.types.map((b) => b.id).join(", ")})`);
    doc.block = { id: block.id, name: block.name, positions: block.positions };
  } else if (isObject(doc.block) && doc.equipment === undefined) {
    block = settings.blocks.types.find((b) => b.id === (doc.block as { id?: unknown }).id);
  }
  if (block && (doc.equipment === undefined || isObject(doc.equipment))) {
    doc.equipment = { coolingMinC: block.minC, blockMaxC: block.maxC, ...((doc.equipment as Record<string, unknown> | undefined) ?? {}) };
  }

  if (doc.dispensing === undefined || isObject(doc.dispensing)) {
    doc.dispensing = { ...settings.dispensing, ...((doc.dispensing as Record<string, unknown> | undefined) ?? {}) };
  }
  if (doc.thresholds === undefined || isObject(doc.thresholds)) {
    const given = (doc.thresholds as Record<string, unknown> | undefined) ?? {};
    const intervals = given.peroxideTestIntervalMonths;
    doc.thresholds = {
      ...settings.thresholds,
      ...given,
      peroxideTestIntervalMonths:
        intervals === undefined || isObject(intervals) ? { ...settings.thresholds.peroxideTestIntervalMonths, ...(intervals ?? {}) } : intervals,
    };
  }
  return doc;
}

/** A new seed for a design's run order: a non-negative 31-bit integer. */
export type SeedSource = () => number;

/** Fixes the seed of a randomised design spec that has none, so the run order is part of the plan. */
export function withFixedSeed(doc: PlanDocument, newSeed: SeedSource): PlanDocument {
  const design = doc.design;
  if (Array.isArray(design.runs) || design.randomize === false || design.seed !== undefined) return doc;
  return { ...doc, design: { ...design, seed: newSeed() } };
}

export interface StoredDocument {
  document: PlanDocument;
  contentHash: string;
}

/**
 * The stored form of a raw plan document (module comment) and its content hash.
 * @throws AppError("invalid_input") with every issue path under `document.`.
 */
export async function storedDocument(raw: Record<string, unknown>, settings: LabSettings, newSeed: SeedSource): Promise<StoredDocument> {
  try {
    const resolved = (await resolvePlanSmiles(raw)) as Record<string, unknown>;
    const filled = withLabDefaults(resolved, settings);
    const parsed = planDocumentSchema.safeParse(filled);
    if (!parsed.success) throw AppError.fromZod(parsed.error, "The plan document is not valid.");
    const document = withFixedSeed(parsed.data, newSeed);
    return { document, contentHash: contentHash(document) };
  } catch (e) {
    return underDocument(e);
  }
}

/** The name a plan is listed under: its document's name, or "Untitled plan". */
export function planName(doc: PlanDocument): string {
  return doc.name?.trim() || "Untitled plan";
}
