import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
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

/** Uploads a PDF (multipart field "file"), checked by its first bytes and size. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "chemicals.manage");
  const length = Number(req.headers.get("content-length") ?? 0);
  if (length > SDS_MAX_BYTES + 64 * 1024) throw AppError.field("file", "the file is larger than 10 MB");
  let file: File | null = null;
  try {
    const form = await req.formData();
    const f = form.get("file");
    file = f instanceof File ? f : null;
  } catch {
    throw AppError.field("file", "send the PDF as multipart/form-data in the field \"file\"");
  }
  if (!file) throw AppError.field("file", "choose a PDF file");
  const bytes = new Uint8Array(await file.arrayBuffer());
  return Response.json({ sds: await uploadSafetyDataSheet({ labId: access.lab.id, actorUserId: access.userId, chemicalId: p.chemicalId, filename: file.name, bytes }) }, { status: 201 });
});
