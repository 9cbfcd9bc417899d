import { guardedRoute } from "@/lib/auth/guard";
import { getRevision, getSheet } from "@/lib/sheets/service";
import { parseOrdinal, parseRouteId, revisionJson } from "../../../json";

export const dynamic = "force-dynamic";

/** GET /api/v1/sheets/{id}/revisions/{ordinal}: one revision with its inputs and results. */
export const GET = guardedRoute<{ id: string; ordinal: string }>({ permission: "sheet.read" }, async ({ actor, params }) => {
  const sheetId = parseRouteId(params.id, "Sheet");
  const ordinal = parseOrdinal(params.ordinal);
  const sheet = await getSheet(actor, sheetId);
  const revision = await getRevision(actor, sheet.id, ordinal);
  return { revision: revisionJson(revision, sheet.kind) };
});
