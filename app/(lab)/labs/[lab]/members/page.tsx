import { pageLabAccess } from "@/lib/auth/page-access";
import { listMembers } from "@/lib/members/server/list-members";
import { MembersClient } from "@/components/members/members-client";

export const metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "members.manage");
  const members = await listMembers({ labId: access.lab.id });
  return (
    <div className="flex flex-col gap-5">
      <div>
        <h1>Members</h1>
        <p className="mt-1 text-sm text-ink-soft">Invite people, set their role in {access.lab.name}, or remove them. Every change is recorded in the audit log.</p>
      </div>
      <MembersClient labSlug={access.lab.slug} me={access.userId} initial={members} />
    </div>
  );
}
