import type { ReactNode } from "react";
import { pageLabAccess } from "@/lib/auth/page-access";
import { isNavMenu, navMenuFor, SETTINGS_NAV } from "@/lib/navigation";
import { SettingsNav } from "@/components/shell/settings-nav";

/** The lab settings area: its own section list beside the page (lib/navigation.ts SETTINGS_NAV). */
export default async function SettingsLayout({ children, params }: { children: ReactNode; params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug);
  const menu = navMenuFor(access.role, [SETTINGS_NAV])[0];
  const items = menu && isNavMenu(menu) ? menu.items : [];
  return (
    <div className="flex flex-col gap-6 md:flex-row md:gap-8">
      <SettingsNav links={items.map((i) => ({ label: i.label, href: `/labs/${access.lab.slug}${i.path}` }))} />
      <div className="min-w-0 flex-1">{children}</div>
    </div>
  );
}
