import { guardedRoute } from "@/lib/auth/guard";
import { notFound, validationError } from "@/lib/errors";
import { getRevision, getSheet } from "@/lib/sheets/service";

export const dynamic = "force-dynamic";

/**
 * The network of a bus network sheet as a JSON file in the calculation's input shape
 * (the latest revision, or `?rev=<ordinal>`): what the import takes back. Any role that
 * reads sheets; another organisation's sheet is a 404.
 */
export const GET = guardedRoute<{ id: string; sheetId: string }>({ permission: "sheet.read" }, async ({ req, actor, params }) => {
  const sheet = await getSheet(actor, params.sheetId);
  if (String(sheet.projectId) !== params.id) throw notFound("Sheet not found");
  if (sheet.kind !== "bus-network") throw validationError({ sheet: "Only a bus network sheet has a network to download" }, "Only a bus network sheet has a network to download");
  const rev = new URL(req.url).searchParams.get("rev");
  const shown = rev === null ? sheet.current : await getRevision(actor, sheet.id, rev);
  const name = `${sheet.tag}-rev-${shown.label}`.replace(/[^A-Za-z0-9._-]+/g, "_");
  return new Response(JSON.stringify(shown.inputs, null, 1), {
    headers: { "content-type": "application/json; charset=utf-8", "content-disposition": `attachment; filename="${name}.json"`, "cache-control": "no-store" },
  });
});
