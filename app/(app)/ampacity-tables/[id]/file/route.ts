import { findAmpacityTableDetail } from "@/db/queries/ampacity-tables";
import { findUpload } from "@/db/queries/uploads";
import { guardedRoute } from "@/lib/auth/guard";
import { notFound } from "@/lib/errors";

export const dynamic = "force-dynamic";

/** The table's CSV byte for byte, as it was uploaded (its SHA-256 is on the table's page). */
export const GET = guardedRoute<{ id: string }>({ permission: "ampacity.read" }, async ({ actor, params }) => {
  if (!/^\d{1,10}$/.test(params.id)) throw notFound("Ampacity table not found");
  const t = await findAmpacityTableDetail(actor.organisationId, Number(params.id));
  const file = await findUpload(actor.organisationId, t.uploadId, "ampacity-table");
  const ascii = file.filename.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return new Response(new Uint8Array(file.data), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-length": String(file.sizeBytes),
      "content-disposition": `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(file.filename)}`,
      "x-content-sha256": file.sha256,
      "cache-control": "private, no-store",
    },
  });
});
