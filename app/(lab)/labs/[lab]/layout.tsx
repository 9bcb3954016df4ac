import type { ReactNode } from "react";
import { pageLabAccess } from "@/lib/auth/page-access";
import { listMyLabs } from "@/lib/auth/access";
import { isNavMenu, navMenuFor } from "@/lib/navigation";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AppShell } from "@/components/shell/app-shell";
import { LabNav, type LabNavEntry } from "@/components/shell/lab-nav";
import { LabSwitcher } from "@/components/shell/lab-switcher";

export const dynamic = "force-dynamic";

export default async function LabLayout({ children, params }: { children: ReactNode; params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug);
  const labs = await listMyLabs(access.userId);
  const href = (path: string) => `/labs/${access.lab.slug}${path}`;
  const entries: LabNavEntry[] = navMenuFor(access.role).map((e) =>
    isNavMenu(e) ? { label: e.label, items: e.items.map((i) => ({ label: i.label, href: href(i.path) })) } : { label: e.label, href: href(e.path) },
  );
  return (
    <AppShell
      user={access.user}
      roleLabel={ROLE_LABELS[access.role]}
      lab={
        <>
          <LabSwitcher current={access.lab.slug} labs={labs} />
          <LabNav entries={entries} />
        </>
      }
    >
      {children}
    </AppShell>
  );
}
