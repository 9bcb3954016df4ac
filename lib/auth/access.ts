import "server-only";
import { cache } from "react";
import { AppError } from "@/lib/errors/app-error";
import { Lab, Membership } from "@/lib/server/models";
import { authenticateApiToken } from "@/lib/api-tokens/server/authenticate-api-token";
import { readRequestBearer } from "@/lib/api-tokens/server/read-request-token";
import { can, type Permission } from "./permissions";
import { ROLE_LABELS, type Role } from "./roles";
import { requireUser, type SessionUser } from "./session";

export interface LabAccess {
  lab: { id: string; slug: string; name: string };
  role: Role;
  /** The person acting: the signed-in user, or for an API token the lab member who created it. */
  userId: string;
  /** The lab API token the request authenticated with, or null for a signed-in session. */
  token: { id: string; name: string } | null;
}

/**
 * The user's access to the lab with `labSlug`: not_found (404) when they are not a
 * member (another lab's records are invisible, not forbidden), forbidden (403) when
 * their role lacks `permission`.
 */
export async function authorizeLab(opts: { userId: string; labSlug: string; permission?: Permission }): Promise<LabAccess> {
  const access = await membershipAccess(opts.userId, opts.labSlug);
  if (opts.permission && !can(access.role, opts.permission)) {
    throw new AppError("forbidden", `Your role in ${access.lab.name} does not allow this (${opts.permission}).`);
  }
  return access;
}

/**
 * The membership lookup behind authorizeLab, memoised per request (React `cache`): a lab
 * layout and its page ask for the same lab and share one query. Outside a server render
 * it simply runs.
 */
const membershipAccess = cache(async (userId: string, labSlug: string): Promise<LabAccess> => {
  const membership = await Membership.findOne({
    where: { userId },
    include: [{ model: Lab, as: "lab", where: { slug: labSlug }, required: true }],
  });
  if (!membership?.lab) throw new AppError("not_found", `No lab "${labSlug}" among your labs.`);
  return { lab: { id: membership.lab.id, slug: membership.lab.slug, name: membership.lab.name }, role: membership.role, userId, token: null };
});

/**
 * What every lab page, route handler and server action calls. A request with
 * `Authorization: Bearer <token>` is a lab API token's (lib/api-tokens): 401 when the token
 * is not valid, revoked or expired, 404 for any lab but its own, 403 when its role (or its
 * creator's current role) lacks `permission`. Any other request needs a session (401
 * without) and a membership of the lab (`authorizeLab`).
 */
export async function requireLabAccess(labSlug: string, permission?: Permission): Promise<LabAccess & { user: SessionUser }> {
  const bearer = await readRequestBearer();
  if (bearer !== null) return tokenLabAccess(bearer, labSlug, permission);
  const user = await requireUser();
  const access = await authorizeLab({ userId: user.id, labSlug, permission });
  return { ...access, user };
}

/** requireLabAccess for a lab API token: it acts for its creator, with its own role. */
async function tokenLabAccess(secret: string, labSlug: string, permission?: Permission): Promise<LabAccess & { user: SessionUser }> {
  const token = await authenticateApiToken(secret);
  if (token.lab.slug !== labSlug) throw new AppError("not_found", `No lab "${labSlug}" for this API token.`);
  if (permission && !(can(token.role, permission) && can(token.creatorRole, permission))) {
    const which = can(token.role, permission) ? `its creator's role (${ROLE_LABELS[token.creatorRole].toLowerCase()})` : `its role (${ROLE_LABELS[token.role].toLowerCase()})`;
    throw new AppError("forbidden", `The API token "${token.name}" may not do this: ${which} does not allow ${permission}.`);
  }
  return { lab: token.lab, role: token.role, userId: token.creator.id, token: { id: token.id, name: token.name }, user: token.creator };
}

/** The labs a user belongs to, for the lab switcher. */
export async function listMyLabs(userId: string): Promise<Array<{ slug: string; name: string; role: Role }>> {
  const rows = await Membership.findAll({ where: { userId }, include: [{ model: Lab, as: "lab", required: true }] });
  return rows
    .map((m) => ({ slug: m.lab!.slug, name: m.lab!.name, role: m.role }))
    .sort((a, b) => a.name.localeCompare(b.name));
}
