import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { inTransaction } from "@/lib/server/db";
import { storedDocument, underDocument } from "../document";
import { safeDesign, safeDesignRequestSchema, type SafeDesignReport } from "../safe-design";
import { withInventoryFacts } from "./evaluate-stored-plan";
import { randomSeed } from "./common";

/**
 * The safe-design report of a plan document the chemist is editing (`POST
 * /plans/alternatives`): the runs that block and the alternatives, judged on the document
 * as it would be stored — the lab's defaults filled in, the inventory's hazard facts of
 * linked chemicals applied — exactly as the plan page would compute its cautions. Reads
 * only; nothing is stored or audited.
 * @throws AppError invalid_input at `document.<path>` (nothing else happens).
 */
export async function suggestSafeDesign(opts: { labId: string; input: unknown }, t?: Transaction): Promise<SafeDesignReport> {
  const body = parseOrThrow(safeDesignRequestSchema, opts.input, "The request is not valid.");
  const linked = await inTransaction(t, async (tx) => {
    const { settings } = await getLabSettings({ labId: opts.labId }, tx);
    const stored = await storedDocument(body.document, settings, randomSeed);
    return withInventoryFacts({ labId: opts.labId, document: stored.document, refuseUnknownChemicals: true }, tx);
  });
  try {
    return safeDesign({ sent: body.document, evaluated: linked.document }, { model: body.model, kinds: body.kinds });
  } catch (e) {
    return underDocument(e);
  }
}
