import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";

type Ctx = { params: Promise<{ lab: string }> };

/** `{ version, settings: { vessels, blocks, dispensing, thresholds } }`, defaults filled in. */
export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "settings.read");
  return getLabSettings({ labId: lab.id });
});
