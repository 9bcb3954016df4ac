import { pageLabAccess } from "@/lib/auth/page-access";
import { listAudit, listAuditFilters } from "@/lib/members/server/list-audit";
import { auditQuerySchema } from "@/lib/audit/schemas";
import { AuditLogClient } from "@/components/audit/audit-log-client";

export const metadata = { title: "Audit log" };

export default async function AuditPage({ params, searchParams }: { params: Promise<{ lab: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "audit.read");
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string"));
  // A hand-edited address that does not parse shows the first page, unfiltered.
  const parsed = auditQuerySchema.safeParse(raw);
  const q = parsed.success ? parsed.data : auditQuerySchema.parse({});
  const [initial, options] = await Promise.all([listAudit({ labId: access.lab.id, query: q }), listAuditFilters({ labId: access.lab.id })]);
  return (
    <div className="flex flex-col gap-4">
      <div>
        <h1>Audit log</h1>
        <p className="mt-1 text-sm text-ink-soft">Every change in {access.lab.name}, newest first, with what changed. Entries cannot be edited or deleted.</p>
      </div>
      <AuditLogClient labSlug={access.lab.slug} initial={initial} initialFilters={{ entity: q.entity ?? "", actor: q.actor ?? "", page: q.page, pageSize: q.pageSize }} options={options} />
    </div>
  );
}
