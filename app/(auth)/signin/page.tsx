import { Suspense } from "react";
import { SignInForm } from "@/components/auth/sign-in-form";

export const metadata = { title: "Sign in" };

export default function SignInPage() {
  return (
    <>
      <h1 className="mb-1">Sign in</h1>
      <p className="mb-5 text-sm text-ink-faint">Plan, check and review designed experiments.</p>
      <Suspense>
        <SignInForm />
      </Suspense>
    </>
  );
}
