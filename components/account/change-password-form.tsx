"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/schemas/account";
import { postJson } from "@/lib/client/fetch-json";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
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
      <Field label="Current password" htmlFor="currentPassword" error={formState.errors.currentPassword?.message}>
        <input id="currentPassword" type="password" autoComplete="current-password" className={inputClass} {...register("currentPassword")} />
      </Field>
      <Field label="New password" htmlFor="newPassword" hint="At least 10 characters." error={formState.errors.newPassword?.message}>
        <input id="newPassword" type="password" autoComplete="new-password" className={inputClass} {...register("newPassword")} />
      </Field>
      <Field label="Repeat the new password" htmlFor="confirmPassword" error={formState.errors.confirmPassword?.message}>
        <input id="confirmPassword" type="password" autoComplete="new-password" className={inputClass} {...register("confirmPassword")} />
      </Field>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Change password"}
      </Button>
    </form>
  );
}
