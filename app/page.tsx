import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import type { Role } from "@/lib/auth/roles";
import { currentUser } from "@/lib/auth/session";
import { listMyLabs } from "@/lib/auth/access";
import { AppShell } from "@/components/shell/app-shell";

export const dynamic = "force-dynamic";

/** Where a member of several labs lands: the lab last chosen in the switcher, else where they hold the broadest role. */
const ROLE_RANK: Record<Role, number> = { lab_admin: 0, safety_officer: 1, stockkeeper: 2, chemist: 3, viewer: 4 };

/** Home: straight to one of your labs. */
export default async function HomePage() {
  const user = await currentUser();
  if (!user) redirect("/signin");
  const labs = await listMyLabs(user.id);
  const preferred = (await cookies()).get("tareline-lab")?.value;
  const target = labs.find((l) => l.slug === preferred) ?? [...labs].sort((a, b) => ROLE_RANK[a.role] - ROLE_RANK[b.role])[0];
  if (target) redirect(`/labs/${target.slug}`);
  return (
    <AppShell user={user}>
      <h1>No lab yet</h1>
      <p className="mt-2 text-sm text-ink-soft">Your account is not a member of any lab. Ask a lab admin to invite you.</p>
    </AppShell>
  );
}
