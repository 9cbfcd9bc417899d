import { guardedRoute, readJson } from "@/lib/auth/guard";
import { createSheet, listProjectSheets } from "@/lib/sheets/service";
import { createSheetBody } from "../../../sheets/bodies";
import { loadSheetJson, parseRouteId, sheetSummaryJson } from "../../../sheets/json";

export const dynamic = "force-dynamic";

/** GET /api/v1/projects/{id}/sheets: the project's sheets in order, each with its latest revision. */
export const GET = guardedRoute<{ id: string }>({ permission: "sheet.read" }, async ({ actor, params }) => {
  const rows = await listProjectSheets(actor, parseRouteId(params.id, "Project"));
  return { sheets: rows.map(sheetSummaryJson) };
});

/**
 * POST /api/v1/projects/{id}/sheets { kind, tag, title, inputs? }: a new sheet whose first
 * revision is a draft. Invalid inputs are kept; `inputErrors` names the fields.
 */
export const POST = guardedRoute<{ id: string }>({ permission: "sheet.write" }, async ({ req, actor, params }) => {
  const projectId = parseRouteId(params.id, "Project");
  const body = await readJson(req, createSheetBody);
  const written = await createSheet(actor, { ...body, projectId });
  const sheet = await loadSheetJson(actor, written.sheetId);
  return Response.json({ sheet, inputErrors: written.inputErrors }, { status: 201, headers: { location: `/api/v1/sheets/${written.sheetId}` } });
});
