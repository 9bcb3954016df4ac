import "server-only";
import type { Transaction } from "sequelize";
import { ApiToken, User } from "@/lib/server/models";
import { tokenState } from "../rules";
import type { ApiTokenRow } from "../schemas";

/** Tokens as rows for people (creator names looked up in one query). */
export async function toTokenRows(tokens: ApiToken[], now: Date, t?: Transaction): Promise<ApiTokenRow[]> {
  const ids = [...new Set(tokens.map((k) => k.createdBy))];
  const names = new Map((await User.findAll({ where: { id: ids }, transaction: t })).map((u) => [u.id, u.name]));
  return tokens.map((k) => ({
    id: k.id,
    name: k.name,
    role: k.role,
    selector: k.selector,
    createdBy: names.get(k.createdBy) ?? "unknown",
    createdAt: k.createdAt.toISOString(),
    expiresAt: k.expiresAt.toISOString(),
    lastUsedAt: k.lastUsedAt?.toISOString() ?? null,
    revokedAt: k.revokedAt?.toISOString() ?? null,
    state: tokenState(k, now),
  }));
}
