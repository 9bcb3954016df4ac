import Link from "next/link";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { listMyLabs } from "@/lib/auth/access";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AppShell } from "@/components/shell/app-shell";
import { ChangePasswordForm } from "@/components/account/change-password-form";

export const metadata = { title: "Account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  const user = await currentUser();
  if (!user) redirect("/signin");
  const labs = await listMyLabs(user.id);
  return (
    <AppShell user={user}>
      <div className="flex flex-col gap-8">
        <div>
          <h1>Your account</h1>
          <p className="mt-1 text-sm text-ink-soft">{user.email}</p>
        </div>
        <section>
          <h2 className="mb-2">Your labs</h2>
          <ul className="text-sm">
            {labs.map((l) => (
              <li key={l.slug}>
                <Link href={`/labs/${l.slug}`}>{l.name}</Link> <span className="text-ink-faint">· {ROLE_LABELS[l.role]}</span>
              </li>
            ))}
          </ul>
        </section>
        <section>
          <h2 className="mb-3">Change password</h2>
          <ChangePasswordForm />
        </section>
      </div>
    </AppShell>
  );
}
