import Link from "next/link";
import { pageLabAccess } from "@/lib/auth/page-access";
import { navFor } from "@/lib/navigation";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { listMembers } from "@/lib/members/server/list-members";

export const metadata = { title: "Overview" };

export default async function LabOverviewPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "lab.read");
  const members = await listMembers({ labId: access.lab.id });
  const sections = navFor(access.role).filter((n) => n.path !== "");
  return (
    <div className="flex flex-col gap-6">
      <div>
        <p className="text-sm uppercase tracking-wide text-ink-faint">Lab overview</p>
        <h1 data-testid="lab-name">{access.lab.name}</h1>
        <p className="mt-1 text-sm text-ink-soft">
          You are <span className="font-medium">{ROLE_LABELS[access.role].toLowerCase()}</span> here. The lab has{" "}
          <span className="num">{members.length}</span> members.
        </p>
      </div>
      <section className="rounded-lg border border-ink-line bg-paper-card p-5">
        <h2 className="mb-2">What you can open</h2>
        {sections.length === 0 ? (
          <p className="text-sm text-ink-soft">
            Your role can see this overview. Studies and plans arrive in a later release; ask your lab admin if you need more access.
          </p>
        ) : (
          <ul className="list-inside list-disc text-sm">
            {sections.map((s) => (
              <li key={s.path}>
                <Link href={`/labs/${access.lab.slug}${s.path}`}>{s.label}</Link>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
