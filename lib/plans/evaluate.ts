/**
 * A plan's run sheet and cautions, computed by the engine function behind the `plan` verb
 * (lib/chemistry `planReport`) from the stored document. A document that is valid but
 * cannot be planned (amounts that would be impossible, a design the engine refuses) is
 * still a plan the chemist can save and fix: then the run sheet is null and `problem` says
 * why, with paths under `document.`.
 */
import { AppError, type FieldIssue } from "../errors/app-error";
import { planReport, type PlanReport } from "../chemistry/plan-report";
import type { RunSheet } from "../chemistry/run-sheet";
import type { PlanDocumentInput } from "../chemistry/plan-document";
import { PLANNING_NOTICE } from "../hazards/caution-rules";
import type { PlanCautionReport } from "../hazards/plan-cautions";
import { todayIsoUtc } from "../hazards/iso-date";
import { contentHash } from "./content-hash";
import { DOCUMENT_PATH } from "./document";

export interface PlanProblem {
  code: "invalid_input" | "infeasible";
  message: string;
  issues: FieldIssue[];
}

export interface PlanEvaluation {
  /** The `plan` verb's run sheet (everything of its output but the caution report), or null. */
  runSheet: RunSheet | null;
  cautions: PlanCautionReport["cautions"];
  releasable: boolean;
  signOffRequired: boolean;
  signOffReasons: string[];
  /** Per-run pressure estimates against the vessel rating. */
  perRun: PlanCautionReport["perRun"];
  notice: string;
  /** Why there is no run sheet, or null. */
  problem: PlanProblem | null;
  /**
   * Where the document disagrees with the inventory record of a linked chemical (state,
   * density, purity, molarity), at `document.<path>`: shown to the chemist; the inventory's
   * hazard facts were used.
   */
  inventoryIssues: FieldIssue[];
}

/** Splits the `plan` verb's output into the run sheet and the caution report. */
export function splitReport(report: PlanReport, inventoryIssues: FieldIssue[] = []): PlanEvaluation {
  const { cautions, signOffRequired, signOffReasons, releasable, perRun, notice, ...runSheet } = report;
  return { runSheet, cautions, signOffRequired, signOffReasons, releasable, perRun, notice, problem: null, inventoryIssues };
}

/**
 * Evaluates a stored plan document (with the inventory's facts applied, when it links
 * chemicals) with the `plan` verb's engine function. A plan whose run sheet cannot be
 * built is not releasable. The result is shared with other callers (cached, below): read it,
 * do not change it.
 */
export function evaluatePlan(doc: PlanDocumentInput, inventoryIssues: FieldIssue[] = []): PlanEvaluation {
  const key = evaluationKey(doc);
  let ev = key === null ? undefined : cache.get(key);
  if (ev) {
    cache.delete(key!);
  } else {
    ev = deepFreeze(computeEvaluation(doc));
    if (cache.size >= CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
  }
  if (key !== null) cache.set(key, ev);
  return { ...ev, inventoryIssues };
}

/**
 * Evaluations are cached, most recently used kept (a plan page's data is asked for again and
 * again; a 96-run plan takes tens of milliseconds, a D-optimal spec a search). The key is all
 * the evaluation depends on: the SHA-256 of the canonical JSON of the document as evaluated —
 * the stored content with the inventory's facts already applied (statements, flags, the
 * dates of the containers it would use) — and the date the cautions count container ages
 * from (the document's `now`, else today in UTC, as the caution engine takes it). Nothing
 * else invalidates an entry: a new fact or a new day is a new key. Entries are frozen, so a
 * caller cannot change what the next one gets.
 */
const CACHE_ENTRIES = 64;
const cache = new Map<string, Omit<PlanEvaluation, "inventoryIssues">>();

function evaluationKey(doc: PlanDocumentInput): string | null {
  try {
    return `${contentHash(doc)}|${doc.now ?? todayIsoUtc()}`;
  } catch {
    // A value JSON cannot carry: not cacheable (planReport says what is wrong).
    return null;
  }
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object" && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

function computeEvaluation(doc: PlanDocumentInput): Omit<PlanEvaluation, "inventoryIssues"> {
  try {
    const { inventoryIssues: _none, ...ev } = splitReport(planReport(doc));
    return ev;
  } catch (e) {
    if (e instanceof AppError && (e.code === "infeasible" || e.code === "invalid_input")) {
      return {
        runSheet: null,
        cautions: [],
        releasable: false,
        signOffRequired: false,
        signOffReasons: [],
        perRun: [],
        notice: PLANNING_NOTICE,
        problem: { code: e.code, message: e.message, issues: e.issues.map((i) => ({ ...i, path: i.path ? `${DOCUMENT_PATH}.${i.path}` : DOCUMENT_PATH })) },
      };
    }
    throw e;
  }
}
