"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";

/** A held reservation of the plan, as the completion step offers it: the planned amount, adjustable. */
export interface StockLine {
  reservationId: string;
  label: string;
  /** The planned amount as a decimal in `unit`. */
  amount: string;
  unit: string;
}

/**
 * The step before results complete a plan: every held reservation with the amount to
 * consume (the planned amount unless changed; 0 releases it), confirmed together with the
 * last results in one request.
 */
export function CompletePanel({ stock, busy, onCancel, onConfirm }: { stock: StockLine[]; busy: boolean; onCancel: () => void; onConfirm: (lines: Array<{ reservationId: string; amount: string; unit: string }>) => void }) {
  const [amounts, setAmounts] = useState<Record<string, string>>(Object.fromEntries(stock.map((s) => [s.reservationId, s.amount])));
  return (
    <div className="rounded-lg border border-accent/40 bg-accent-light/40 p-3 text-sm" data-testid="complete-panel">
      <p className="font-medium">These results complete the plan.</p>
      <p className="mb-2 text-ink-soft">Its reserved stock is consumed with the amounts used (planned amounts unless you change them; 0 returns the reservation to stock). What was reserved but not used is free again.</p>
      <table className="mb-2">
        <tbody>
          {stock.map((s) => (
            <tr key={s.reservationId}>
              <td className="pr-3">{s.label}</td>
              <td className="pr-1">
                <input
                  className="num w-28 rounded border border-ink-edge bg-paper-card px-2 py-0.5 text-right"
                  inputMode="decimal"
                  value={amounts[s.reservationId] ?? ""}
                  aria-label={`amount used of ${s.label}`}
                  onChange={(e) => setAmounts((a) => ({ ...a, [s.reservationId]: e.target.value }))}
                  data-testid={`used-${s.reservationId}`}
                />
              </td>
              <td className="text-ink-soft">{s.unit}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex gap-2">
        <Button disabled={busy} data-testid="complete-confirm" onClick={() => onConfirm(stock.map((s) => ({ reservationId: s.reservationId, amount: (amounts[s.reservationId] ?? s.amount).trim(), unit: s.unit })))}>
          Store results and consume stock
        </Button>
        <Button variant="secondary" onClick={onCancel} disabled={busy}>
          Back
        </Button>
      </div>
    </div>
  );
}
