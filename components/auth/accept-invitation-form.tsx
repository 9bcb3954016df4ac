"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { acceptInvitationSchema, type AcceptInvitationInput } from "@/lib/members/schemas";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
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
      <TextField register={register} name="name" label="Your name" autoComplete="name" error={formState.errors.name?.message} />
      <TextField register={register} name="password" label="Choose a password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.password?.message} />
      <TextField register={register} name="confirmPassword" label="Repeat the password" type="password" autoComplete="new-password" error={formState.errors.confirmPassword?.message} />
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Joining…" : "Set password and join"}
      </Button>
    </form>
  );
}
