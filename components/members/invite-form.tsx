"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { inviteMemberSchema, type InviteMemberInput } from "@/lib/members/schemas";
import { ROLES, ROLE_LABELS } from "@/lib/auth/roles";
import { postJson } from "@/lib/client/fetch-json";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Banner } from "@/components/ui/banner";

export function InviteForm({ labSlug, onInvited }: { labSlug: string; onInvited: () => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<InviteMemberInput>({
    resolver: zodResolver(inviteMemberSchema),
    defaultValues: { email: "", role: "chemist" },
  });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson<{ invitation: { email: string } }>(`/api/labs/${labSlug}/members`, values);
    if (!res.ok) {
      for (const issue of res.error.issues) if (issue.path === "email" || issue.path === "role") setError(issue.path, { message: issue.message });
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    setMessage({ tone: "ok", text: `Invitation sent to ${res.data.invitation.email}. It is valid for 7 days.` });
    reset({ email: "", role: values.role });
    onInvited();
  });
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4" noValidate>
      <h2>Invite someone</h2>
      {message && <Banner tone={message.tone} testId="invite-result">{message.text}</Banner>}
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end">
        <Field label="E-mail" htmlFor="invite-email" error={formState.errors.email?.message}>
          <input id="invite-email" type="email" className={inputClass} {...register("email")} />
        </Field>
        <Field label="Role" htmlFor="invite-role" error={formState.errors.role?.message}>
          <select id="invite-role" className={inputClass} {...register("role")}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        </Field>
        <Button type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Sending…" : "Send invitation"}
        </Button>
      </div>
    </form>
  );
}
