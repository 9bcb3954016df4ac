import "server-only";
import type { NextAuthOptions, User as NextAuthUser } from "next-auth";
import type { JWT } from "next-auth/jwt";
import CredentialsProvider from "next-auth/providers/credentials";
import { AppError } from "@/lib/errors/app-error";
import { User } from "@/lib/server/models";
import { authenticate } from "./authenticate";

/** How long a session lasts, in seconds. */
export const SESSION_MAX_AGE = 12 * 60 * 60;

function sessionVersionOf(user: NextAuthUser): number {
  return "sessionVersion" in user && typeof user.sessionVersion === "number" ? user.sessionVersion : 0;
}

/**
 * A session token checked against its user: null unless the user exists and the token's
 * session version is the user's current one (a password change raises it, ending every
 * other session); else the token with the user's current name and e-mail (the one read of
 * the user per request: lib/auth/session.ts `currentUser` takes them from the session).
 */
async function checked(token: JWT): Promise<JWT | null> {
  if (typeof token.uid !== "string") return null;
  const user = await User.findByPk(token.uid, { attributes: ["id", "sessionVersion", "name", "email"] });
  if (!user || user.sessionVersion !== (token.sv ?? 0)) return null;
  return { ...token, name: user.name, email: user.email };
}

/** next-auth configuration: e-mail and password, JWT sessions carrying the user id and session version. */
export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE },
  pages: { signIn: "/signin" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials) {
        try {
          return await authenticate(credentials);
        } catch (error) {
          // next-auth passes this message to the sign-in form.
          if (error instanceof AppError) throw new Error(error.message);
          throw error;
        }
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.sv = sessionVersionOf(user);
        token.name = user.name;
        token.email = user.email;
        return token;
      }
      // Checked on every use: a token from before a password change is emptied (signed out).
      return (await checked(token)) ?? {};
    },
    async session({ session, token }) {
      if (session.user && typeof token.uid === "string") {
        session.user.id = token.uid;
        session.user.name = token.name ?? "";
        session.user.email = token.email ?? "";
      }
      return session;
    },
  },
};
