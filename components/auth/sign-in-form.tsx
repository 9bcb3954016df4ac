"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useRouter, useSearchParams } from "next/navigation";
import { useState } from "react";
import { signInSchema, type SignInInput } from "@/lib/members/schemas";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import { Banner } from "@/components/ui/banner";

export function SignInForm() {
  const router = useRouter();
  const params = useSearchParams();
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: params.get("email") ?? "", password: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const res = await signIn("credentials", { ...values, redirect: false });
    if (!res || res.error) {
      setError(res?.error && res.error !== "CredentialsSignin" ? res.error : "Wrong e-mail or password.");
      return;
    }
    const next = params.get("callbackUrl");
    router.push(next && next.startsWith("/") ? next : "/");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {error && <Banner tone="blocks" testId="sign-in-error">{error}</Banner>}
      <TextField register={register} name="email" label="E-mail" type="email" autoComplete="username" error={formState.errors.email?.message} />
      <TextField register={register} name="password" label="Password" type="password" autoComplete="current-password" error={formState.errors.password?.message} />
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
