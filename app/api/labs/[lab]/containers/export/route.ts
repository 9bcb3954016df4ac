import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { exportContainersCsv } from "@/inventory/server/export-containers";

type Ctx = { params: Promise<{ lab: string }> };

/** Every container of the lab as CSV (cells that would start a formula are neutralised). */
export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  const csv = await exportContainersCsv({ labId: lab.id });
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${lab.slug}-containers.csv"` } });
});
