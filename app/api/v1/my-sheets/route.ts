import { toSheetRow } from "@/components/sheets/sheet-row";
import { guardedRoute } from "@/lib/auth/guard";
import { mySheets } from "@/lib/sheets/service";

export const dynamic = "force-dynamic";

/** GET /api/v1/my-sheets: sheets whose latest revision the caller authored, recently changed first (engineers, leads). */
export const GET = guardedRoute({ permission: "sheet.write" }, async ({ actor }) => ({ sheets: (await mySheets(actor)).map(toSheetRow) }));
