"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { acceptInvitationSchema, type AcceptInvitationInput } from "@/lib/schemas/account";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Banner } from "@/components/ui/banner";
import { postJson } from "@/lib/client/fetch-json";

export function AcceptInvitationForm({ token, email }: { token: string; email: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError: setFieldError } = useForm<AcceptInvitationInput>({ resolver: zodResolver(acceptInvitationSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const res = await postJson(`/api/invitations/${encodeURIComponent(token)}`, values, "POST");
    if (!res.ok) {
      for (const issue of res.error.issues) {
        if (issue.path === "name" || issue.path === "password" || issue.path === "confirmPassword") setFieldError(issue.path, { message: issue.message });
      }
      setError(res.error.message);
      return;
    }
    router.push(`/signin?email=${encodeURIComponent(email)}`);
  });

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {error && <Banner tone="blocks">{error}</Banner>}
      <Field label="Your name" htmlFor="name" error={formState.errors.name?.message}>
        <input id="name" autoComplete="name" className={inputClass} {...register("name")} />
      </Field>
      <Field label="Choose a password" htmlFor="password" hint="At least 10 characters." error={formState.errors.password?.message}>
        <input id="password" type="password" autoComplete="new-password" className={inputClass} {...register("password")} />
      </Field>
      <Field label="Repeat the password" htmlFor="confirmPassword" error={formState.errors.confirmPassword?.message}>
        <input id="confirmPassword" type="password" autoComplete="new-password" className={inputClass} {...register("confirmPassword")} />
      </Field>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Joining…" : "Set password and join"}
      </Button>
    </form>
  );
}
