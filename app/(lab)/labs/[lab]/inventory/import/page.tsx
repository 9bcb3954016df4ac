import { pageLabAccess } from "@/lib/auth/page-access";
import { ImportClient } from "@/components/inventory/import-client";
import { PageHeader } from "@/components/inventory/bits";

export const metadata = { title: "Import containers" };

export default async function ImportPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "stock.manage");
  return (
    <div className="flex flex-col gap-5">
      <PageHeader title="Import containers from CSV">
        Nothing is written until you confirm, and then the whole file goes in at once: if any row has a problem, no row is imported.
      </PageHeader>
      <ImportClient labSlug={access.lab.slug} />
    </div>
  );
}
