import { guardedRoute, readJson } from "@/lib/auth/guard";
import { transitionSheet } from "@/lib/sheets/service";
import { transitionBody } from "../../bodies";
import { loadSheetJson, parseRouteId } from "../../json";

export const dynamic = "force-dynamic";

/**
 * POST /api/v1/sheets/{id}/transitions { transition, version, comment? }: submit,
 * withdraw, approve or return the latest revision. Any member may call it; the workflow
 * decides per role and person (403), state (409) and comment (400).
 */
export const POST = guardedRoute<{ id: string }>({ permission: "sheet.read" }, async ({ req, actor, params }) => {
  const sheetId = parseRouteId(params.id, "Sheet");
  const body = await readJson(req, transitionBody);
  const done = await transitionSheet(actor, { ...body, sheetId });
  return { sheet: await loadSheetJson(actor, sheetId), superseded: done.superseded };
});
