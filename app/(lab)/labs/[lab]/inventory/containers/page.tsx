import Link from "next/link";
import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { listContainers } from "@/inventory/server/containers";
import { listLocations } from "@/inventory/server/locations";
import { listChemicals } from "@/inventory/server/chemicals";
import { todayIso } from "@/inventory/server/common";
import { ContainersClient } from "@/components/inventory/containers-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Containers" };

export default async function ContainersPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "stock.read");
  const canManage = can(access.role, "stock.manage");
  const [initial, locations, chemicals] = await Promise.all([
    listContainers({ labId: access.lab.id, query: { pageSize: 25 } }),
    listLocations({ labId: access.lab.id }),
    listChemicals({ labId: access.lab.id }),
  ]);
  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Containers"
        actions={
          <>
            {canManage && (
              <Link href={`/labs/${access.lab.slug}/inventory/import`} className="rounded-md bg-accent px-3 py-1.5 text-sm font-medium text-paper-card no-underline hover:bg-accent-dark hover:no-underline">
                Import CSV
              </Link>
            )}
            <a href={`/api/labs/${access.lab.slug}/containers/export`} className="rounded-md border border-ink-line bg-paper-card px-3 py-1.5 text-sm font-medium text-ink no-underline hover:bg-paper-deep hover:no-underline">
              Export CSV
            </a>
          </>
        }
      >
        Every container in {access.lab.name}: what is in it, what plans hold, and what is free. {canManage ? "Open a container to see its ledger, count it or change its record." : "You can read stock; stockkeepers and lab admins change it."}
      </PageHeader>
      <ContainersClient labSlug={access.lab.slug} canManage={canManage} initial={initial} locations={locations} chemicals={chemicals.map((c) => ({ id: c.id, name: c.name }))} today={todayIso()} />
    </div>
  );
}
