import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { listMyLabs } from "@/lib/auth/access";
import { AppShell } from "@/components/shell/app-shell";

export const dynamic = "force-dynamic";

/** Home: straight to the first of your labs. */
export default async function HomePage() {
  const user = await currentUser();
  if (!user) redirect("/signin");
  const labs = await listMyLabs(user.id);
  if (labs[0]) redirect(`/labs/${labs[0].slug}`);
  return (
    <AppShell user={user}>
      <h1>No lab yet</h1>
      <p className="mt-2 text-sm text-ink-soft">Your account is not a member of any lab. Ask a lab admin to invite you.</p>
    </AppShell>
  );
}
