import { requireLabAccess } from "@/lib/auth/access";
import { readForm, route } from "@/lib/api/route";
import { AppError } from "@/lib/errors/app-error";
import { getSafetyDataSheet, uploadSafetyDataSheet } from "@/inventory/server/safety-data-sheets";
import { SDS_MAX_BYTES } from "@/inventory/sds";

type Ctx = { params: Promise<{ lab: string; chemicalId: string }> };

/** Downloads the chemical's safety data sheet (always as an attachment, never rendered inline). */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "chemicals.read");
  const sds = await getSafetyDataSheet({ labId: lab.id, chemicalId: p.chemicalId });
  return new Response(new Uint8Array(sds.data), {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(sds.sizeBytes),
      "content-disposition": `attachment; filename="${sds.filename.replace(/[^\w.\- ]/g, "_")}"`,
      "x-content-type-options": "nosniff",
    },
  });
});

/**
 * Uploads a PDF (multipart field "file"), checked by its first bytes and size. The body's
 * size is enforced while it streams (route option maxBytes), before it is parsed.
 */
export const POST = route(
  async (req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, "chemicals.manage");
    const f = readForm(req).get("file");
    if (!(f instanceof File)) throw AppError.field("file", "choose a PDF file");
    const bytes = new Uint8Array(await f.arrayBuffer());
    return Response.json({ sds: await uploadSafetyDataSheet({ labId: access.lab.id, actorUserId: access.userId, chemicalId: p.chemicalId, filename: f.name, bytes }) }, { status: 201 });
  },
  { body: "multipart", maxBytes: SDS_MAX_BYTES + 64 * 1024 },
);
