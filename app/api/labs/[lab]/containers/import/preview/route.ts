import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { IMPORT_BODY_LIMIT } from "@/inventory/schemas";
import { previewImport } from "@/inventory/server/import-containers";

type Ctx = { params: Promise<{ lab: string }> };

/** Checks a container CSV ({ csv, mapping? }) and shows what would be imported. Writes nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.manage");
  return { preview: await previewImport({ labId: lab.id, input: await readJson(req) }) };
}, { maxBytes: IMPORT_BODY_LIMIT });
