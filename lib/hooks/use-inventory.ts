"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { ChemicalRow, ContainerRow, LedgerRow, ReservationRow } from "@/inventory/schemas";

export interface ContainerPage {
  rows: ContainerRow[];
  total: number;
  page: number;
  pageSize: number;
}
export interface ContainerDetail {
  container: ContainerRow;
  ledger: LedgerRow[];
  reservations: ReservationRow[];
}
export interface LocationRow {
  id: string;
  name: string;
  notes: string | null;
}
export interface StockAlerts {
  today: string;
  lowStock: Array<{ chemicalId: string; name: string; free: ContainerRow["amount"]; mark: ContainerRow["amount"] }>;
  expired: ContainerRow[];
  nearExpiry: ContainerRow[];
  peroxideDue: ContainerRow[];
}

/** One page of the lab's containers for a query string (filter, sort and paging on the server). */
export function useContainers(labSlug: string, query: string, fallback?: ContainerPage) {
  return useSWR<ContainerPage>(`/api/labs/${labSlug}/containers?${query}`, getJson, { fallbackData: fallback, keepPreviousData: true });
}

/** One container with its ledger and reservations. */
export function useContainer(labSlug: string, containerId: string, fallback?: ContainerDetail) {
  return useSWR<ContainerDetail>(`/api/labs/${labSlug}/containers/${containerId}`, getJson, { fallbackData: fallback });
}

/** The lab's chemical catalogue. */
export function useChemicals(labSlug: string, fallback?: ChemicalRow[]) {
  return useSWR<{ chemicals: ChemicalRow[] }>(`/api/labs/${labSlug}/chemicals`, getJson, { fallbackData: fallback ? { chemicals: fallback } : undefined });
}

/** The lab's storage locations. */
export function useLocations(labSlug: string, fallback?: LocationRow[]) {
  return useSWR<{ locations: LocationRow[] }>(`/api/labs/${labSlug}/locations`, getJson, { fallbackData: fallback ? { locations: fallback } : undefined });
}

/** The lab's reservations with one status (or all). */
export function useReservations(labSlug: string, status: "held" | "consumed" | "released" | "all", fallback?: ReservationRow[]) {
  return useSWR<{ reservations: ReservationRow[] }>(`/api/labs/${labSlug}/reservations?status=${status}`, getJson, { fallbackData: fallback ? { reservations: fallback } : undefined });
}

/** Low stock, expiry and peroxide-test alerts. */
export function useStockAlerts(labSlug: string, fallback?: StockAlerts) {
  return useSWR<{ alerts: StockAlerts }>(`/api/labs/${labSlug}/inventory/alerts`, getJson, { fallbackData: fallback ? { alerts: fallback } : undefined });
}
