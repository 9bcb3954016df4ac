/** Client-side JSON requests that return the app's one error shape instead of throwing. */
import type { FieldIssue } from "@/lib/errors/app-error";

export type JsonResult<T> =
  | { ok: true; data: T }
  /** `details`: what the error body carries beside `error` (a refused release's `shortfalls`). */
  | { ok: false; status: number; error: { code: string; message: string; issues: FieldIssue[] }; details?: Record<string, unknown> };

export async function postJson<T = unknown>(url: string, body: unknown, method: "POST" | "PUT" | "PATCH" | "DELETE" = "POST"): Promise<JsonResult<T>> {
  let res: Response;
  try {
    res = await fetch(url, { method, headers: { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
  } catch {
    return { ok: false, status: 0, error: { code: "network", message: "Could not reach the server. Check your connection and try again.", issues: [] } };
  }
  const json = (await res.json().catch(() => null)) as unknown;
  if (res.ok) return { ok: true, data: json as T };
  const { error: err, ...details } = (json ?? {}) as { error?: { code: string; message: string; issues?: FieldIssue[] } } & Record<string, unknown>;
  return { ok: false, status: res.status, error: { code: err?.code ?? "unknown", message: err?.message ?? `The server answered ${res.status}.`, issues: err?.issues ?? [] }, details };
}

/** SWR's fetcher: throws an Error carrying the server's message. */
export async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url);
  const json = (await res.json().catch(() => null)) as unknown;
  if (!res.ok) {
    const message = (json as { error?: { message?: string } } | null)?.error?.message ?? `The server answered ${res.status}.`;
    throw new Error(message);
  }
  return json as T;
}
