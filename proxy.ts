import { withAuth } from "next-auth/middleware";

// Only redirects anonymous visitors to sign-in; every page and handler checks roles itself.
export default withAuth({ pages: { signIn: "/signin" } });

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|favicon.ico|signin|invite|fonts).*)"],
};
