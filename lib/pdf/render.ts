import { loadFonts, renderTree } from "./render-core.mjs";
import { sheetDocument } from "./sheet-pages";
import type { SheetPdfData } from "./types";

// The fonts are read as soon as a route that renders PDFs is loaded, while its first
// request is still reading the sheet; a failure shows in that request's rendering.
loadFonts().catch(() => {});

/** One sheet's PDF, rendered in this thread (a sheet is a few pages: well under the time of a request). */
export function renderSheetPdf(d: SheetPdfData): Promise<Buffer> {
  return renderTree(sheetDocument(d));
}

/** A file name safe in a Content-Disposition header. */
export function pdfFilename(...parts: string[]): string {
  return `${parts.join("_").replace(/[^A-Za-z0-9._-]+/g, "-").replace(/-+/g, "-")}.pdf`;
}

export function pdfResponse(data: Buffer, filename: string): Response {
  return new Response(new Uint8Array(data), {
    status: 200,
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${filename}"`,
      "content-length": String(data.length),
      "cache-control": "private, no-store",
    },
  });
}
