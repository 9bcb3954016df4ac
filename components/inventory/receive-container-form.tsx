"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { containerInputSchema, type ContainerInput } from "@/inventory/schemas";
import { STOCK_UNITS } from "@/inventory/units";
import { postJson } from "@/lib/client/fetch-json";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Banner } from "@/components/ui/banner";
import type { LocationRow } from "@/lib/hooks/use-inventory";

type Output = z.output<typeof containerInputSchema>;
const FIELDS = ["chemicalId", "barcode", "lot", "locationId", "amount", "unit", "concentration", "concentrationUnit", "solvent", "purityPercent", "receivedOn", "openedOn", "expiresOn"] as const;

/** Receives a new container (react-hook-form with the shared zod schema; server errors land on their fields). */
export function ReceiveContainerForm({ labSlug, chemicals, locations, onCreated }: { labSlug: string; chemicals: Array<{ id: string; name: string }>; locations: LocationRow[]; onCreated: () => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<ContainerInput, unknown, Output>({
    resolver: zodResolver(containerInputSchema),
    defaultValues: { chemicalId: "", barcode: "", amount: "", unit: "g", lot: "", locationId: "", concentration: "", concentrationUnit: "", solvent: "", purityPercent: "", receivedOn: new Date().toISOString().slice(0, 10), openedOn: "", expiresOn: "" },
  });
  const err = (k: (typeof FIELDS)[number]) => formState.errors[k]?.message;
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson<{ container: { id: string } }>(`/api/labs/${labSlug}/containers`, values);
    if (!res.ok) {
      for (const i of res.error.issues) if ((FIELDS as readonly string[]).includes(i.path)) setError(i.path as (typeof FIELDS)[number], { message: i.message });
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    setMessage({ tone: "ok", text: `Container ${values.barcode} received.` });
    reset({ chemicalId: values.chemicalId, barcode: "", amount: "", unit: values.unit, lot: "", locationId: values.locationId ?? "", concentration: "", concentrationUnit: "", solvent: "", purityPercent: "", receivedOn: values.receivedOn ?? "", openedOn: "", expiresOn: "" });
    onCreated();
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="Chemical" htmlFor="rc-chemical" error={err("chemicalId")}>
          <select id="rc-chemical" className={inputClass} {...register("chemicalId")}>
            <option value="">Choose…</option>
            {chemicals.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Barcode" htmlFor="rc-barcode" error={err("barcode")}>
          <input id="rc-barcode" className={inputClass} {...register("barcode")} />
        </Field>
        <Field label="Amount" htmlFor="rc-amount" error={err("amount")}>
          <input id="rc-amount" inputMode="decimal" className={`${inputClass} num`} {...register("amount")} />
        </Field>
        <Field label="Unit" htmlFor="rc-unit" error={err("unit")}>
          <select id="rc-unit" className={inputClass} {...register("unit")}>
            {STOCK_UNITS.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Location" htmlFor="rc-location" error={err("locationId")}>
          <select id="rc-location" className={inputClass} {...register("locationId")}>
            <option value="">None</option>
            {locations.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Lot" htmlFor="rc-lot" error={err("lot")}>
          <input id="rc-lot" className={inputClass} {...register("lot")} />
        </Field>
        <Field label="Purity (%)" htmlFor="rc-purity" error={err("purityPercent")}>
          <input id="rc-purity" inputMode="decimal" className={`${inputClass} num`} {...register("purityPercent")} />
        </Field>
        <Field label="Expiry" htmlFor="rc-expiry" error={err("expiresOn")}>
          <input id="rc-expiry" type="date" className={inputClass} {...register("expiresOn")} />
        </Field>
        <Field label="Concentration (solutions)" htmlFor="rc-conc" error={err("concentration")}>
          <input id="rc-conc" inputMode="decimal" className={`${inputClass} num`} {...register("concentration")} />
        </Field>
        <Field label="Concentration unit" htmlFor="rc-conc-unit" error={err("concentrationUnit")}>
          <select id="rc-conc-unit" className={inputClass} {...register("concentrationUnit")}>
            <option value="">—</option>
            <option value="M">M (mol/L)</option>
            <option value="mg/mL">mg/mL</option>
          </select>
        </Field>
        <Field label="Solvent" htmlFor="rc-solvent" error={err("solvent")}>
          <input id="rc-solvent" className={inputClass} {...register("solvent")} />
        </Field>
        <Field label="Received" htmlFor="rc-received" error={err("receivedOn")}>
          <input id="rc-received" type="date" className={inputClass} {...register("receivedOn")} />
        </Field>
      </div>
      <div>
        <Button type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Saving…" : "Receive container"}
        </Button>
      </div>
    </form>
  );
}
