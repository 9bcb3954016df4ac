/**
 * The session replaced for integration tests that call route handlers directly (the
 * database and everything else are real). In a test file:
 *
 *   vi.mock("@/lib/auth/session", () => import("../support/fake-session"));
 *   import { signInAs, routeCtx } from "../support/fake-session";
 *   signInAs(SEED.users.chemist);  // then call a handler with routeCtx({ planId })
 *
 * It has the same exports as lib/auth/session.ts.
 */
import { AppError } from "@/lib/errors/app-error";
import type { SessionUser } from "@/lib/auth/session";
import { SEED } from "./integration";

const state: { user: SessionUser | null } = { user: null };

export async function currentUser(): Promise<SessionUser | null> {
  return state.user;
}

export async function requireUser(): Promise<SessionUser> {
  if (!state.user) throw new AppError("unauthenticated", "Sign in first.");
  return state.user;
}

/** A password change re-issues the cookie in the app; there is no cookie here. */
export async function reissueSession(): Promise<void> {}

/** Makes the following handler calls run as `user` (null: no session). */
export function signInAs(user: { id: string; email: string } | null): void {
  state.user = user ? ({ id: user.id, email: user.email, name: user.email } as SessionUser) : null;
}

/** The route context Next passes a handler: `{ params: Promise<{ lab, ...params }> }`. */
export function routeCtx<P extends Record<string, string>>(params: P, labSlug: string = SEED.labs.kestrel.slug) {
  return { params: Promise.resolve({ lab: labSlug, ...params }) };
}
