/**
 * TEST FIXTURES for the results and analysis tests (not product code): request helpers for
 * calling route handlers in-process, and `forcePlanState`, which sets a plan's state
 * directly in the database so a test can enter results without going through review and
 * release (those flows have tests of their own). Nothing outside tests/ imports this.
 */
import { Plan } from "@/lib/server/models";
import type { PlanState } from "@/lib/plans/states";

export const ctxOf =
  (labSlug: string) =>
  <P extends Record<string, string>>(params: P, lab: string = labSlug) => ({ params: Promise.resolve({ lab, ...params }) });

export const req = (path: string, method = "GET", body?: unknown): Request =>
  new Request(`http://test.invalid${path}`, { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

/** TEST FIXTURE: puts a plan straight into `state` (bypassing the review and release flow). */
export async function forcePlanState(planId: string, state: PlanState): Promise<void> {
  const [n] = await Plan.update({ state }, { where: { id: planId } });
  if (n !== 1) throw new Error(`forcePlanState: no plan ${planId}`);
}

export type Json = Record<string, unknown>;
