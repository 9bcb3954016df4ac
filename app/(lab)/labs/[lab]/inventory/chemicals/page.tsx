import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { listChemicals } from "@/inventory/server/chemicals";
import { ChemicalsClient } from "@/components/inventory/chemicals-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Chemicals" };

export default async function ChemicalsPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "chemicals.read");
  const chemicals = await listChemicals({ labId: access.lab.id });
  return (
    <div className="flex flex-col gap-5">
      <PageHeader title="Chemicals">
        The lab&apos;s catalogue: identity, constants used for conversions (molar mass, density), GHS statements and hazard flags, low-stock marks and safety data sheets (PDF, at most 10 MB).
      </PageHeader>
      <ChemicalsClient labSlug={access.lab.slug} canManage={can(access.role, "chemicals.manage")} initial={chemicals} />
    </div>
  );
}
