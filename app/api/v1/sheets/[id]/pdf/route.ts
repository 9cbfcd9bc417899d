import { guardedRoute } from "@/lib/auth/guard";
import { loadSheetPdfData } from "@/lib/pdf/load";
import { pdfFilename, pdfResponse, renderSheetPdf } from "@/lib/pdf/render";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/sheets/:id/pdf[?rev=<ordinal>]: the sheet's PDF (latest revision by default). Any member (sheet.read); another organisation's sheet is a 404. */
export const GET = guardedRoute<{ id: string }>({ permission: "sheet.read" }, async ({ req, actor, params }) => {
  const rev = new URL(req.url).searchParams.get("rev");
  const data = await loadSheetPdfData(actor, params.id, rev ?? undefined);
  const pdf = await renderSheetPdf(data);
  return pdfResponse(pdf, pdfFilename(data.project.code, data.sheet.tag, `rev-${data.revision.label}`));
});
