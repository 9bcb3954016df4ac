import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { stockAlerts } from "@/inventory/server/stock-alerts";

type Ctx = { params: Promise<{ lab: string }> };

/** Low stock, expired and near-expiry containers, and peroxide formers due for a test. */
export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  return { alerts: await stockAlerts({ labId: lab.id }) };
});
