import { findAmpacityTableDetail } from "@/db/queries/ampacity-tables";
import { guardedRoute } from "@/lib/auth/guard";
import { notFound } from "@/lib/errors";

export const dynamic = "force-dynamic";

/** GET /api/v1/ampacity-tables/{id}: one version with its rows (SI: m², °C, A) and the uploaded file's SHA-256. */
export const GET = guardedRoute<{ id: string }>({ permission: "ampacity.read" }, async ({ actor, params }) => {
  if (!/^\d{1,10}$/.test(params.id)) throw notFound("Ampacity table not found");
  const t = await findAmpacityTableDetail(actor.organisationId, Number(params.id));
  return {
    table: {
      id: t.id,
      name: t.name,
      version: t.version,
      source: t.source,
      active: t.active,
      rowCount: t.rowCount,
      fileSha256: t.fileSha256,
      createdAt: t.createdAt.toISOString(),
      createdByName: t.createdByName,
      retiredAt: t.retiredAt?.toISOString() ?? null,
      rows: t.rows,
    },
  };
});
