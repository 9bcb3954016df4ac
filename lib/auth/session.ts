import "server-only";
import { cache } from "react";
import { cookies } from "next/headers";
import { getServerSession } from "next-auth";
import { decode, encode } from "next-auth/jwt";
import { AppError } from "@/lib/errors/app-error";
import { serverEnv } from "@/lib/server/env";
import { SESSION_MAX_AGE, authOptions } from "./options";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/**
 * The signed-in user, read from the session; null when signed out. The session is confirmed
 * in the database on every read (lib/auth/options.ts: the jwt callback reads the user, ends a
 * token from before a password change, and gives the user's current name and e-mail).
 * Memoised per request, so a layout and its page read the session once.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  return { id, email: session.user?.email ?? "", name: session.user?.name ?? "" };
});

/** The signed-in user, or AppError unauthenticated (HTTP 401). */
export async function requireUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw new AppError("unauthenticated", "Sign in first.");
  return user;
}

/** The session cookie's name, as next-auth names it (secure prefix on https). */
function sessionCookieName(): string {
  return `${serverEnv().NEXTAUTH_URL?.startsWith("https://") ? "__Secure-" : ""}next-auth.session-token`;
}

/**
 * After a password change: re-issues the current session's cookie with the user's new
 * session version, so this session continues while every other one ends. Call from a
 * route handler (it sets a cookie).
 */
export async function reissueSession(sessionVersion: number): Promise<void> {
  const jar = await cookies();
  const name = sessionCookieName();
  const current = jar.get(name)?.value;
  if (!current) return;
  const secret = serverEnv().NEXTAUTH_SECRET;
  const token = await decode({ token: current, secret });
  if (!token) return;
  const value = await encode({ token: { ...token, sv: sessionVersion }, secret, maxAge: SESSION_MAX_AGE });
  jar.set(name, value, { httpOnly: true, sameSite: "lax", path: "/", secure: name.startsWith("__Secure-"), maxAge: SESSION_MAX_AGE });
}
