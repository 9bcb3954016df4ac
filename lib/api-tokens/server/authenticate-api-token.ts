import "server-only";
import { Op } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import type { Role } from "@/lib/auth/roles";
import { Membership, User, ApiToken } from "@/lib/server/models";
import { tokenState } from "../rules";
import { findTokenBySecret } from "./find-token-by-secret";

export interface AuthenticatedToken {
  id: string;
  name: string;
  role: Role;
  lab: { id: string; slug: string; name: string };
  /** The person who created the token: it acts on their behalf. */
  creator: { id: string; email: string; name: string };
  /** The creator's role in the lab now: a token never does more than its creator may. */
  creatorRole: Role;
}

/** last_used_at is written at most once a minute per token. */
const LAST_USED_RESOLUTION_MS = 60_000;

/**
 * Checks a presented API token secret. Throws AppError unauthenticated (HTTP 401) when it
 * is not a token of any lab, when it is revoked or expired, or when its creator is no
 * longer a member of its lab. Records when it was last used.
 */
export async function authenticateApiToken(presented: string, now: Date = new Date()): Promise<AuthenticatedToken> {
  const token = await findTokenBySecret(presented);
  if (!token?.lab) throw new AppError("unauthenticated", "The API token is not valid.");
  const state = tokenState(token, now);
  if (state === "revoked") throw new AppError("unauthenticated", `The API token "${token.name}" was revoked on ${token.revokedAt!.toISOString().slice(0, 10)}.`);
  if (state === "expired") throw new AppError("unauthenticated", `The API token "${token.name}" expired on ${token.expiresAt.toISOString().slice(0, 10)}; ask a lab admin for a new one.`);
  const membership = await Membership.findOne({ where: { labId: token.labId, userId: token.createdBy }, include: [{ model: User, as: "user", required: true }] });
  if (!membership?.user) {
    throw new AppError("unauthenticated", `The person who created the API token "${token.name}" is no longer a member of the lab; ask a lab admin for a new token.`);
  }
  await ApiToken.update(
    { lastUsedAt: now },
    { where: { id: token.id, [Op.or]: [{ lastUsedAt: null }, { lastUsedAt: { [Op.lt]: new Date(now.getTime() - LAST_USED_RESOLUTION_MS) } }] }, silent: true },
  );
  const { lab, user } = { lab: token.lab, user: membership.user };
  return {
    id: token.id,
    name: token.name,
    role: token.role,
    lab: { id: lab.id, slug: lab.slug, name: lab.name },
    creator: { id: user.id, email: user.email, name: user.name },
    creatorRole: membership.role,
  };
}
