import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { parseResultsCsv, type ParsedResultsCsv } from "../csv-import";
import { resultsCsvSchema } from "../schemas";
import { loadPlanForResults } from "./common";
import { planRunRefs } from "./run-refs";

/**
 * Checks a results CSV against the plan (`POST /plans/{plan}/results/preview`,
 * `{ csv, mapping? }`) and shows what it would store: each row with its run, every
 * problem with its row and column, the warnings. Stores nothing; confirming sends the same
 * file to `PUT /plans/{plan}/results`, which runs the same checks.
 * @throws AppError invalid_input (the body), not_found.
 */
export async function previewResultsCsv(opts: { labId: string; planId: string; input: unknown }, t?: Transaction): Promise<ParsedResultsCsv> {
  const body = parseOrThrow(resultsCsvSchema, opts.input, "The file is not valid.");
  const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId }, t);
  return parseResultsCsv(body.csv, { runs: await planRunRefs(p, opts.labId, t), responses: p.responses }, body.mapping);
}
