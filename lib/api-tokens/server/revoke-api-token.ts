import "server-only";
import type { Transaction } from "sequelize";
import { z } from "zod";
import { AppError } from "@/lib/errors/app-error";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { ApiToken } from "@/lib/server/models";
import type { ApiTokenRow } from "../schemas";
import { toTokenRows } from "./to-token-rows";

/**
 * Revokes one token of the lab: it stops working at once (401 from then on). Revoking a
 * revoked token changes nothing and returns it as it is. not_found for another lab's
 * token or an id that is not one. Audited.
 */
export async function revokeApiToken(opts: { labId: string; actorUserId: string; tokenId: string; now?: Date }, t?: Transaction): Promise<ApiTokenRow> {
  if (!z.uuid().safeParse(opts.tokenId).success) throw new AppError("not_found", "No such API token in this lab.", [{ path: "tokenId", message: "not a token id" }]);
  const now = opts.now ?? new Date();
  return inTransaction(t, async (tx) => {
    const token = await ApiToken.findOne({ where: { id: opts.tokenId, labId: opts.labId }, lock: tx.LOCK.UPDATE, transaction: tx });
    if (!token) throw new AppError("not_found", "No such API token in this lab.", [{ path: "tokenId", message: "no such token" }]);
    if (!token.revokedAt) {
      token.revokedAt = now;
      token.revokedBy = opts.actorUserId;
      await token.save({ transaction: tx });
      await audit(
        { labId: opts.labId, actorUserId: opts.actorUserId, action: "api_token.revoked", entityType: "api_token", entityId: token.id, before: { name: token.name, revokedAt: null }, after: { name: token.name, revokedAt: now.toISOString() } },
        tx,
      );
    }
    const [row] = await toTokenRows([token], now, tx);
    return row!;
  });
}
