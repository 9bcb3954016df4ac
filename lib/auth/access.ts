import "server-only";
import { cache } from "react";
import { AppError } from "@/lib/errors/app-error";
import { Lab, Membership } from "@/lib/server/models";
import { can, type Permission } from "./permissions";
import type { Role } from "./roles";
import { requireUser, type SessionUser } from "./session";

export interface LabAccess {
  lab: { id: string; slug: string; name: string };
  role: Role;
  userId: string;
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
  return { lab: { id: membership.lab.id, slug: membership.lab.slug, name: membership.lab.name }, role: membership.role, userId };
});

/** Session check plus `authorizeLab`: what every lab page, route handler and server action calls. */
export async function requireLabAccess(labSlug: string, permission?: Permission): Promise<LabAccess & { user: SessionUser }> {
  const user = await requireUser();
  const access = await authorizeLab({ userId: user.id, labSlug, permission });
  return { ...access, user };
}

/** The labs a user belongs to, for the lab switcher. */
export async function listMyLabs(userId: string): Promise<Array<{ slug: string; name: string; role: Role }>> {
  const rows = await Membership.findAll({ where: { userId }, include: [{ model: Lab, as: "lab", required: true }] });
  return rows
    .map((m) => ({ slug: m.lab!.slug, name: m.lab!.name, role: m.role }))
    .sort((a, b) => a.name.localeCompare(b.name));
}
