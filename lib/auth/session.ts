import "server-only";
import { cache } from "react";
import { getServerSession } from "next-auth";
import { AppError } from "@/lib/errors/app-error";
import { User } from "@/lib/server/models";
import { authOptions } from "./options";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/**
 * The signed-in user, read from the session and confirmed in the database; null when
 * signed out. Memoised per request, so a layout and its page read the session once.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  const user = await User.findByPk(id);
  return user ? { id: user.id, email: user.email, name: user.name } : null;
});

/** The signed-in user, or AppError unauthenticated (HTTP 401). */
export async function requireUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw new AppError("unauthenticated", "Sign in first.");
  return user;
}
