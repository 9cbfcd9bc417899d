import { guardedRoute, readJson } from "@/lib/auth/guard";
import { saveSheet } from "@/lib/sheets/service";
import { saveSheetBody } from "../bodies";
import { loadSheetJson, parseRouteId } from "../json";

export const dynamic = "force-dynamic";

/** GET /api/v1/sheets/{id}: the sheet, its latest revision with inputs and results, and every revision. */
export const GET = guardedRoute<{ id: string }>({ permission: "sheet.read" }, async ({ actor, params }) => {
  return { sheet: await loadSheetJson(actor, parseRouteId(params.id, "Sheet")) };
});

/**
 * PATCH /api/v1/sheets/{id} { version, inputs, title? }: saves against the version the
 * client read; a stale version is a 409 and nothing is written.
 */
export const PATCH = guardedRoute<{ id: string }>({ permission: "sheet.write" }, async ({ req, actor, params }) => {
  const sheetId = parseRouteId(params.id, "Sheet");
  const body = await readJson(req, saveSheetBody);
  const written = await saveSheet(actor, { ...body, sheetId });
  return { sheet: await loadSheetJson(actor, sheetId), newRevision: written.newRevision, inputErrors: written.inputErrors };
});
