import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { IMPORT_BODY_LIMIT } from "@/inventory/schemas";
import { confirmImport } from "@/inventory/server/import-containers";

type Ctx = { params: Promise<{ lab: string }> };

/** Imports a container CSV ({ csv, mapping? }) the stockkeeper previewed: all rows in one transaction, or none. */
export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "stock.manage");
  return Response.json({ result: await confirmImport({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
}, { maxBytes: IMPORT_BODY_LIMIT });
