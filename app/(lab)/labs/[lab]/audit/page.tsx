import { pageLabAccess } from "@/lib/auth/page-access";
import { listAudit } from "@/lib/members/server/list-audit";

export const metadata = { title: "Audit log" };

function summary(value: unknown): string {
  if (value === null || value === undefined) return "—";
  return JSON.stringify(value);
}

export default async function AuditPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "audit.read");
  const entries = await listAudit({ labId: access.lab.id, limit: 200 });
  return (
    <div className="flex flex-col gap-4">
      <div>
        <h1>Audit log</h1>
        <p className="mt-1 text-sm text-ink-soft">Every change in {access.lab.name}, newest first. Entries cannot be edited or deleted.</p>
      </div>
      {entries.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-line bg-paper-card px-4 py-8 text-center text-sm text-ink-soft">Nothing has changed in this lab yet.</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
          <table className="w-full text-sm" data-testid="audit">
            <thead>
              <tr className="border-b border-ink-line bg-paper-deep/60 text-left text-ink-soft">
                <th className="px-3 py-2 font-medium">When (UTC)</th>
                <th className="px-3 py-2 font-medium">Who</th>
                <th className="px-3 py-2 font-medium">What</th>
                <th className="px-3 py-2 font-medium">Before</th>
                <th className="px-3 py-2 font-medium">After</th>
              </tr>
            </thead>
            <tbody>
              {entries.map((e) => (
                <tr key={e.id} className="border-b border-ink-line/60 last:border-0">
                  <td className="whitespace-nowrap px-3 py-2">{e.at.slice(0, 19).replace("T", " ")}</td>
                  <td className="px-3 py-2">{e.actor ?? "system"}</td>
                  <td className="px-3 py-2 font-mono text-xs">{e.action}</td>
                  <td className="px-3 py-2 font-mono text-xs text-ink-soft">{summary(e.before)}</td>
                  <td className="px-3 py-2 font-mono text-xs text-ink-soft">{summary(e.after)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
