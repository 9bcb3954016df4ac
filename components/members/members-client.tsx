"use client";

import { useState } from "react";
import { ROLES, ROLE_LABELS, type Role } from "@/lib/auth/roles";
import type { MembershipRow } from "@/lib/members/schemas";
import { useMembers } from "@/lib/hooks/use-members";
import { postJson } from "@/lib/client/fetch-json";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { InviteForm } from "./invite-form";

const col = tableColumns<MembershipRow>();

export function MembersClient({ labSlug, me, initial }: { labSlug: string; me: string; initial: MembershipRow[] }) {
  const { data, mutate, error: loadError } = useMembers(labSlug, initial);
  const [error, setError] = useState<string | null>(null);
  const members = data?.members ?? initial;

  async function changeRole(m: MembershipRow, role: Role) {
    setError(null);
    const res = await postJson(`/api/labs/${labSlug}/members/${m.id}`, { role }, "PATCH");
    if (!res.ok) setError(res.error.message);
    await mutate();
  }
  async function remove(m: MembershipRow) {
    if (!window.confirm(`Remove ${m.name} from this lab? Their account stays; they lose access to this lab.`)) return;
    setError(null);
    const res = await postJson(`/api/labs/${labSlug}/members/${m.id}`, undefined, "DELETE");
    if (!res.ok) setError(res.error.message);
    await mutate();
  }

  const columns = col.columns([
    col.accessor("name", { header: "Name" }),
    col.accessor("email", { header: "E-mail" }),
    col.display({
      id: "role",
      header: "Role",
      cell: ({ row }) => (
        <select
          aria-label={`Role of ${row.original.name}`}
          data-testid={`role-${row.original.email}`}
          className="rounded-md border border-ink-line bg-paper-card px-2 py-1 text-sm"
          value={row.original.role}
          onChange={(e) => changeRole(row.original, e.target.value as Role)}
        >
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </select>
      ),
    }),
    col.accessor("joinedAt", { header: "Joined", cell: (info) => <span className="num">{info.getValue().slice(0, 10)}</span> }),
    col.display({
      id: "actions",
      header: "",
      cell: ({ row }) =>
        row.original.userId === me ? (
          <span className="text-xs text-ink-faint">you</span>
        ) : (
          <Button variant="danger" onClick={() => remove(row.original)}>
            Remove
          </Button>
        ),
    }),
  ]);

  return (
    <div className="flex flex-col gap-5">
      <InviteForm labSlug={labSlug} onInvited={() => void mutate()} />
      {(error || loadError) && <Banner tone="blocks">{error ?? (loadError as Error).message}</Banner>}
      <DataTable columns={columns} data={members} rowId={(m) => m.id} testId="members" empty="No members yet." />
    </div>
  );
}
