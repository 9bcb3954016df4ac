"use client";

import { useState } from "react";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import type { ApiTokenRow } from "@/lib/api-tokens/schemas";
import { useApiTokens } from "@/lib/hooks/use-api-tokens";
import { postJson } from "@/lib/client/fetch-json";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { CreateTokenForm } from "./create-token-form";
import { OneTimeSecret } from "./one-time-secret";

const col = tableColumns<ApiTokenRow>();

const STATE_TONE: Record<ApiTokenRow["state"], string> = {
  active: "bg-ok-bg text-ok",
  expired: "bg-caution-bg text-caution",
  revoked: "bg-paper-deep text-ink-faint",
};

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : null);

/** The lab's API tokens: create one (its secret shown once), the list with last use, revoke. */
export function ApiTokensClient({ labSlug, appUrl, roles, initial }: { labSlug: string; appUrl: string; roles: Role[]; initial: ApiTokenRow[] }) {
  const { data, mutate, error: loadError } = useApiTokens(labSlug, initial);
  const [created, setCreated] = useState<{ name: string; secret: string } | null>(null);
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const tokens = data?.tokens ?? initial;

  async function revoke(token: ApiTokenRow) {
    if (!window.confirm(`Revoke the token "${token.name}"? Scripts using it stop working at once. This cannot be undone.`)) return;
    setMessage(null);
    const res = await postJson(`/api/labs/${labSlug}/tokens/${token.id}`, undefined, "DELETE");
    setMessage(res.ok ? { tone: "ok", text: `The token "${token.name}" is revoked.` } : { tone: "blocks", text: res.error.message });
    await mutate();
  }

  const columns = col.columns([
    col.accessor("name", {
      header: "Name",
      cell: (i) => (
        <div>
          <div className="font-medium">{i.getValue()}</div>
          <div className="font-mono text-xs text-ink-faint" title="The token's first characters, to recognise it">
            {i.row.original.selector}…
          </div>
        </div>
      ),
    }),
    col.accessor("role", { header: "Role", cell: (i) => ROLE_LABELS[i.getValue()] }),
    col.accessor("createdAt", {
      header: "Created",
      cell: (i) => (
        <div>
          <span className="num">{day(i.getValue())}</span>
          <div className="text-xs text-ink-faint">by {i.row.original.createdBy}</div>
        </div>
      ),
    }),
    col.accessor("expiresAt", { header: "Expires", cell: (i) => <span className="num whitespace-nowrap">{day(i.getValue())}</span> }),
    col.accessor("lastUsedAt", {
      header: "Last used",
      cell: (i) => (i.getValue() ? <span className="num whitespace-nowrap">{i.getValue()!.slice(0, 16).replace("T", " ")} UTC</span> : <span className="text-ink-faint">never</span>),
    }),
    col.accessor("state", {
      header: "Status",
      cell: (i) => (
        <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${STATE_TONE[i.getValue()]}`}>
          {i.getValue()}
          {i.getValue() === "revoked" && i.row.original.revokedAt ? ` ${day(i.row.original.revokedAt)}` : ""}
        </span>
      ),
    }),
    col.display({
      id: "actions",
      header: "",
      cell: ({ row }) =>
        row.original.state === "revoked" ? null : (
          <Button variant="danger" onClick={() => void revoke(row.original)} data-testid={`revoke-${row.original.name}`}>
            Revoke
          </Button>
        ),
    }),
  ]);

  return (
    <div className="flex flex-col gap-5">
      <section className="rounded-lg border border-ink-line bg-paper-card p-4">
        <h2 className="mb-3">New token</h2>
        <CreateTokenForm
          labSlug={labSlug}
          roles={roles}
          onCreated={(c) => {
            setMessage(null);
            setCreated(c);
            void mutate();
          }}
        />
      </section>
      {created && <OneTimeSecret name={created.name} secret={created.secret} example={`curl -H "Authorization: Bearer ${created.secret}" ${appUrl.replace(/\/$/, "")}/api/labs/${labSlug}/containers`} onDone={() => setCreated(null)} />}
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      {loadError && <Banner tone="blocks">{(loadError as Error).message}</Banner>}
      <DataTable columns={columns} data={tokens} rowId={(t) => t.id} rowTestId={(t) => `token-${t.name}`} testId="tokens" empty="No API tokens yet." />
    </div>
  );
}
