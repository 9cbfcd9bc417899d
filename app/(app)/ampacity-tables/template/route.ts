import { guardedRoute } from "@/lib/auth/guard";
import { AMPACITY_TEMPLATE_CSV, AMPACITY_TEMPLATE_FILENAME } from "@/lib/ampacity/template";

/** The CSV template: the header Ohmstead reads, with the rules as comment lines. */
export const GET = guardedRoute({ permission: "ampacity.read" }, async () => {
  // With a byte-order mark so spreadsheet programs open it as UTF-8 (the importer removes it).
  return new Response(`\uFEFF${AMPACITY_TEMPLATE_CSV}`, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${AMPACITY_TEMPLATE_FILENAME}"`,
      "cache-control": "private, max-age=300",
    },
  });
});
