import "server-only";
import type { Transaction } from "sequelize";
import { Membership, User } from "@/lib/server/models";
import type { MembershipRow } from "@/lib/members/schemas";

/** Every member of one lab, by name. */
export async function listMembers({ labId }: { labId: string }, t?: Transaction): Promise<MembershipRow[]> {
  const rows = await Membership.findAll({ where: { labId }, include: [{ model: User, as: "user", required: true }], transaction: t });
  return rows
    .map((m) => ({ id: m.id, userId: m.user!.id, email: m.user!.email, name: m.user!.name, role: m.role, joinedAt: m.createdAt.toISOString() }))
    .sort((a, b) => a.name.localeCompare(b.name));
}
