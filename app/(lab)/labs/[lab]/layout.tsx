import type { ReactNode } from "react";
import { pageLabAccess } from "@/lib/auth/page-access";
import { listMyLabs } from "@/lib/auth/access";
import { navFor } from "@/lib/navigation";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AppShell } from "@/components/shell/app-shell";
import { LabNav } from "@/components/shell/lab-nav";
import { LabSwitcher } from "@/components/shell/lab-switcher";

export const dynamic = "force-dynamic";

export default async function LabLayout({ children, params }: { children: ReactNode; params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug);
  const labs = await listMyLabs(access.userId);
  const links = navFor(access.role).map((item) => ({ label: item.label, href: `/labs/${access.lab.slug}${item.path}` }));
  return (
    <AppShell
      user={access.user}
      roleLabel={ROLE_LABELS[access.role]}
      lab={
        <>
          <LabSwitcher current={access.lab.slug} labs={labs} />
          <LabNav links={links} />
        </>
      }
    >
      {children}
    </AppShell>
  );
}
