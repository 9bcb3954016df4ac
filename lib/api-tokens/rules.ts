/**
 * The rules of lab API tokens, pure: who may hand out which role, how long a token lives,
 * and whether it is usable now.
 */
import { covers } from "@/lib/auth/permissions";
import { ROLES, type Role } from "@/lib/auth/roles";

/** A token's lifetime in whole days: at least one day, at most about a year. */
export const TOKEN_LIFETIME_DAYS = { min: 1, max: 366, default: 90 } as const;

/** The roles `role` may give a token: those whose every permission `role` itself holds. */
export function grantableTokenRoles(role: Role): Role[] {
  return ROLES.filter((r) => covers(role, r));
}

/** When a token made at `now` with a lifetime of `days` stops working. */
export function tokenExpiry(now: Date, days: number): Date {
  return new Date(now.getTime() + days * 86_400_000);
}

export type TokenState = "active" | "expired" | "revoked";

/** Revoked wins over expired; a token is expired from its expiry instant on. */
export function tokenState(token: { expiresAt: Date; revokedAt: Date | null }, now: Date): TokenState {
  if (token.revokedAt) return "revoked";
  return token.expiresAt.getTime() <= now.getTime() ? "expired" : "active";
}
