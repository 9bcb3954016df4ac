import Link from "next/link";
import { notFound } from "next/navigation";
import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors/app-error";
import { getContainer } from "@/inventory/server/containers";
import { containerLedger, listReservations } from "@/inventory/server/ledger";
import { listLocations } from "@/inventory/server/locations";
import { todayIso } from "@/inventory/server/common";
import { ContainerDetailClient } from "@/components/inventory/container-detail-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Container" };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function ContainerPage({ params }: { params: Promise<{ lab: string; containerId: string }> }) {
  const { lab: slug, containerId } = await params;
  const access = await pageLabAccess(slug, "stock.read");
  if (!UUID.test(containerId)) notFound();
  try {
    const [container, ledger, reservations, locations] = await Promise.all([
      getContainer({ labId: access.lab.id, containerId }),
      containerLedger({ labId: access.lab.id, containerId }),
      listReservations({ labId: access.lab.id, containerId, status: "all" }),
      listLocations({ labId: access.lab.id }),
    ]);
    return (
      <div className="flex flex-col gap-5">
        <p className="text-sm">
          <Link href={`/labs/${access.lab.slug}/inventory/containers`}>← All containers</Link>
        </p>
        <PageHeader title={`${container.barcode} · ${container.chemicalName}`}>
          <span data-testid="container-heading">Stock record of container {container.barcode}{container.location ? `, kept in ${container.location}` : ""}.</span>
        </PageHeader>
        <ContainerDetailClient labSlug={access.lab.slug} canManage={can(access.role, "stock.manage")} initial={{ container, ledger, reservations }} locations={locations} today={todayIso()} />
      </div>
    );
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  }
}
