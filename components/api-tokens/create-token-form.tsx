"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { createApiTokenSchema, TOKEN_LIFETIME_CHOICES, type CreateApiTokenInput, type CreatedApiToken } from "@/lib/api-tokens/schemas";
import { TOKEN_LIFETIME_DAYS } from "@/lib/api-tokens/rules";
import { postJson } from "@/lib/client/fetch-json";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";

const FIELDS = ["name", "role", "expiresInDays"] as const;

/** Name, role and lifetime of a new token, checked with the same schema as the API. */
export function CreateTokenForm({ labSlug, roles, onCreated }: { labSlug: string; roles: Role[]; onCreated: (c: { name: string; secret: string }) => void }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError: setFieldError, reset } = useForm<CreateApiTokenInput>({
    resolver: zodResolver(createApiTokenSchema),
    defaultValues: { name: "", role: roles.includes("viewer") ? "viewer" : roles[0], expiresInDays: TOKEN_LIFETIME_DAYS.default },
  });
  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const res = await postJson<CreatedApiToken>(`/api/labs/${labSlug}/tokens`, values);
    if (!res.ok) {
      for (const issue of res.error.issues) {
        const f = FIELDS.find((k) => k === issue.path);
        if (f) setFieldError(f, { message: issue.message });
      }
      setError(res.error.message);
      return;
    }
    reset();
    onCreated({ name: res.data.token.name, secret: res.data.secret });
  });
  const err = (k: (typeof FIELDS)[number]) => formState.errors[k]?.message;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {error && <Banner tone="blocks">{error}</Banner>}
      <div className="grid gap-3 sm:grid-cols-[2fr_1fr_1fr] sm:items-start">
        <Field label="Name" htmlFor="token-name" error={err("name")} hint="what will use it, e.g. nightly stock export">
          <input id="token-name" className={inputClass} autoComplete="off" {...register("name")} />
        </Field>
        <Field label="Role" htmlFor="token-role" error={err("role")} hint="what the token may do">
          <select id="token-role" className={inputClass} {...register("role")}>
            {roles.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Expires after" htmlFor="token-expiry" error={err("expiresInDays")}>
          <select id="token-expiry" className={`${inputClass} num`} {...register("expiresInDays", { valueAsNumber: true })}>
            {TOKEN_LIFETIME_CHOICES.map((d) => (
              <option key={d} value={d}>
                {d} days
              </option>
            ))}
          </select>
        </Field>
      </div>
      <div>
        <Button type="submit" disabled={formState.isSubmitting}>
          Create token
        </Button>
      </div>
    </form>
  );
}
