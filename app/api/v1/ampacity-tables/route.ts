import { listAmpacityTables } from "@/db/queries/ampacity-tables";
import { guardedRoute } from "@/lib/auth/guard";
import { validationError } from "@/lib/errors";

export const dynamic = "force-dynamic";

/** GET /api/v1/ampacity-tables?active=1: the organisation's ampacity tables, one entry per version (active ones only with active=1). */
export const GET = guardedRoute({ permission: "ampacity.read" }, async ({ req, actor }) => {
  const active = new URL(req.url).searchParams.get("active");
  if (active !== null && active !== "0" && active !== "1") throw validationError({ active: "active must be 0 or 1" });
  const tables = await listAmpacityTables(actor.organisationId, { activeOnly: active === "1" });
  return { tables: tables.map((t) => ({ ...t, createdAt: t.createdAt.toISOString(), retiredAt: t.retiredAt?.toISOString() ?? null })) };
});
