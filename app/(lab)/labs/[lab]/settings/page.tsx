import { notFound, redirect } from "next/navigation";
import { pageLabAccess } from "@/lib/auth/page-access";
import { navMenuFor, SETTINGS_NAV, isNavMenu } from "@/lib/navigation";

/** /settings opens the first settings page the role may open. */
export default async function SettingsPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug);
  const menu = navMenuFor(access.role, [SETTINGS_NAV])[0];
  const first = menu && isNavMenu(menu) ? menu.items[0] : undefined;
  if (!first) notFound();
  redirect(`/labs/${access.lab.slug}${first.path}`);
}
