"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { locationInputSchema, type LocationInput } from "@/inventory/schemas";
import { postJson } from "@/lib/client/fetch-json";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";

/** Adds a storage location (names are unique per lab). */
export function LocationForm({ labSlug, onCreated }: { labSlug: string; onCreated: () => void }) {
  const [done, setDone] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<LocationInput, unknown, z.output<typeof locationInputSchema>>({
    resolver: zodResolver(locationInputSchema),
    defaultValues: { name: "", notes: "" },
  });
  const onSubmit = handleSubmit(async (v) => {
    setDone(null);
    const res = await postJson(`/api/labs/${labSlug}/locations`, v);
    if (!res.ok) {
      setError("name", { message: res.error.issues.find((i) => i.path === "name")?.message ?? res.error.message });
      return;
    }
    setDone(`Location ${v.name} added.`);
    reset({ name: "", notes: "" });
    onCreated();
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-[1fr_2fr_auto] sm:items-end">
      <Field label="New location" htmlFor="loc-name" error={formState.errors.name?.message} hint={done ?? undefined}>
        <input id="loc-name" className={inputClass} placeholder="e.g. Fridge R2 (4 °C)" {...register("name")} />
      </Field>
      <Field label="Notes" htmlFor="loc-notes" error={formState.errors.notes?.message}>
        <input id="loc-notes" className={inputClass} {...register("notes")} />
      </Field>
      <Button type="submit" variant="secondary" disabled={formState.isSubmitting}>
        Add location
      </Button>
    </form>
  );
}
