import "server-only";
import { UniqueConstraintError, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { ApiToken } from "@/lib/server/models";
import { grantableTokenRoles, tokenExpiry } from "../rules";
import { createApiTokenSchema, type CreatedApiToken } from "../schemas";
import { newTokenSecret } from "../secret";
import { toTokenRows } from "./to-token-rows";

/**
 * Creates a lab API token with a name, a role and a lifetime, and returns its secret (the
 * only time it is shown; only its SHA-256 is kept). `actorRole` is the role of whoever asks:
 * a token never gets a permission that role lacks (forbidden, naming `role`). A name already
 * used by a live token of the lab is a conflict naming `name`. Audited.
 */
export async function createApiToken(opts: { labId: string; actorUserId: string; actorRole: Role; input: unknown; now?: Date }, t?: Transaction): Promise<CreatedApiToken> {
  const input = parseOrThrow(createApiTokenSchema, opts.input);
  if (!grantableTokenRoles(opts.actorRole).includes(input.role)) {
    throw new AppError("forbidden", `A ${ROLE_LABELS[opts.actorRole].toLowerCase()} cannot create a token with the role ${ROLE_LABELS[input.role].toLowerCase()}.`, [
      { path: "role", message: "more than your own role allows" },
    ]);
  }
  const now = opts.now ?? new Date();
  const { secret, selector, hash } = newTokenSecret();
  return inTransaction(t, async (tx) => {
    const token = await ApiToken.create(
      { labId: opts.labId, name: input.name, role: input.role, selector, secretHash: hash, createdBy: opts.actorUserId, expiresAt: tokenExpiry(now, input.expiresInDays), revokedAt: null, revokedBy: null, lastUsedAt: null },
      { transaction: tx },
    ).catch((e: unknown) => {
      if (e instanceof UniqueConstraintError) {
        throw new AppError("conflict", `A live token named "${input.name}" already exists in this lab: choose another name or revoke that one.`, [{ path: "name", message: "already used by a live token" }]);
      }
      throw e;
    });
    await audit(
      { labId: opts.labId, actorUserId: opts.actorUserId, action: "api_token.created", entityType: "api_token", entityId: token.id, after: { name: token.name, role: token.role, selector, expiresAt: token.expiresAt.toISOString() } },
      tx,
    );
    const [row] = await toTokenRows([token], now, tx);
    return { token: row!, secret };
  });
}
