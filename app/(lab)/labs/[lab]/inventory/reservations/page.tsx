import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { listReservations } from "@/inventory/server/ledger";
import { ReservationsClient } from "@/components/inventory/reservations-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Reservations" };

export default async function ReservationsPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "stock.read");
  const held = await listReservations({ labId: access.lab.id, status: "held" });
  return (
    <div className="flex flex-col gap-5">
      <PageHeader title="Reservations">
        Amounts held for plans. Consume a reservation with the amount actually used (the rest returns to stock) or release a stale one; a cancelled plan releases its own.
      </PageHeader>
      <ReservationsClient labSlug={access.lab.slug} canManage={can(access.role, "stock.manage")} initial={held} />
    </div>
  );
}
