"use client";

import { useState } from "react";
import type { ReservationRow } from "@/inventory/schemas";
import { postJson } from "@/lib/client/fetch-json";
import { STOCK_UNITS } from "@/inventory/units";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";

/** Consume (with the amount actually used) or release one held reservation. */
export function ReservationActions({ labSlug, reservation, dimension, onDone }: { labSlug: string; reservation: ReservationRow; dimension: "mass" | "volume"; onDone: (message?: string) => void }) {
  const units = STOCK_UNITS.filter((u) => (dimension === "mass" ? u.endsWith("g") : u.endsWith("L")));
  const [open, setOpen] = useState(false);
  const [amount, setAmount] = useState("");
  const [unit, setUnit] = useState<string>(reservation.amount.display.split(" ")[1] ?? units[0] ?? "g");
  const [error, setError] = useState<string | null>(null);

  async function release() {
    const reason = window.prompt(`Release ${reservation.amount.display} held for ${reservation.planRef}? Give a reason:`, "stale reservation");
    if (!reason) return;
    const res = await postJson(`/api/labs/${labSlug}/reservations/${reservation.id}/release`, { reason });
    if (!res.ok) setError(res.error.message);
    onDone(res.ok ? "Reservation released." : undefined);
  }
  async function consume(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    const res = await postJson(`/api/labs/${labSlug}/reservations/${reservation.id}/consume`, { amount, unit });
    if (!res.ok) {
      setError(res.error.issues[0]?.message ?? res.error.message);
      return;
    }
    setOpen(false);
    onDone("Use recorded.");
  }
  return (
    <div className="flex flex-col items-end gap-1">
      {open ? (
        <form onSubmit={consume} className="flex items-center gap-1" noValidate>
          <input aria-label="Amount used" inputMode="decimal" className={`${inputClass} num w-24`} value={amount} onChange={(e) => setAmount(e.target.value)} />
          <select aria-label="Unit" className={inputClass} value={unit} onChange={(e) => setUnit(e.target.value)}>
            {units.map((u) => (
              <option key={u}>{u}</option>
            ))}
          </select>
          <Button type="submit">Record use</Button>
          <Button type="button" variant="secondary" onClick={() => setOpen(false)}>
            Cancel
          </Button>
        </form>
      ) : (
        <div className="flex gap-1">
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Consume…
          </Button>
          <Button variant="danger" onClick={() => void release()}>
            Release
          </Button>
        </div>
      )}
      {error && <p className="text-xs text-blocks">{error}</p>}
    </div>
  );
}
