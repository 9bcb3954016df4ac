import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { stockAlerts } from "@/inventory/server/stock-alerts";
import { listChemicals } from "@/inventory/server/chemicals";
import { AlertsClient } from "@/components/inventory/alerts-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Shortfalls and low stock" };

export default async function AlertsPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "stock.read");
  const [alerts, chemicals] = await Promise.all([stockAlerts({ labId: access.lab.id }), listChemicals({ labId: access.lab.id })]);
  return (
    <div className="flex flex-col gap-5">
      <PageHeader title="Shortfalls and low stock">What to order, test or use up first. Dates are counted in UTC.</PageHeader>
      <AlertsClient labSlug={access.lab.slug} canManage={can(access.role, "stock.manage")} initial={alerts} chemicals={chemicals.map((c) => ({ id: c.id, name: c.name }))} />
    </div>
  );
}
