import "next-auth";
import "next-auth/jwt";

declare module "next-auth" {
  interface Session {
    user?: { id?: string; name?: string | null; email?: string | null; image?: string | null };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    uid?: string;
    /** The user's session version when the token was issued (lib/auth/options.ts). */
    sv?: number;
  }
}
