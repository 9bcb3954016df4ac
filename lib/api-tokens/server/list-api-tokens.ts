import "server-only";
import type { Transaction } from "sequelize";
import { ApiToken } from "@/lib/server/models";
import type { ApiTokenRow } from "../schemas";
import { toTokenRows } from "./to-token-rows";

/** Every API token of one lab, newest first, revoked and expired ones included. */
export async function listApiTokens(opts: { labId: string; now?: Date }, t?: Transaction): Promise<ApiTokenRow[]> {
  const tokens = await ApiToken.findAll({ where: { labId: opts.labId }, order: [["createdAt", "DESC"], ["id", "DESC"]], transaction: t });
  return toTokenRows(tokens, opts.now ?? new Date(), t);
}
