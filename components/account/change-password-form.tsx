"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/members/schemas";
import { postJson } from "@/lib/client/fetch-json";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import { Banner } from "@/components/ui/banner";

export function ChangePasswordForm() {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<ChangePasswordInput>({ resolver: zodResolver(changePasswordSchema) });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson("/api/account/password", values);
    if (!res.ok) {
      for (const i of res.error.issues) if (i.path === "currentPassword" || i.path === "newPassword" || i.path === "confirmPassword") setError(i.path, { message: i.message });
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    reset({ currentPassword: "", newPassword: "", confirmPassword: "" });
    setMessage({ tone: "ok", text: "Password changed. Use the new one next time you sign in." });
  });
  return (
    <form onSubmit={onSubmit} className="flex max-w-sm flex-col gap-4" noValidate>
      {message && <Banner tone={message.tone} testId="password-result">{message.text}</Banner>}
      <TextField register={register} name="currentPassword" label="Current password" type="password" autoComplete="current-password" error={formState.errors.currentPassword?.message} />
      <TextField register={register} name="newPassword" label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.newPassword?.message} />
      <TextField register={register} name="confirmPassword" label="Repeat the new password" type="password" autoComplete="new-password" error={formState.errors.confirmPassword?.message} />
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Change password"}
      </Button>
    </form>
  );
}
