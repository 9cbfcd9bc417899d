import { toSheetRow } from "@/components/sheets/sheet-row";
import { guardedRoute } from "@/lib/auth/guard";
import { reviewQueue } from "@/lib/sheets/service";

export const dynamic = "force-dynamic";

/** GET /api/v1/review-queue: sheets waiting for a check, the caller's own excluded, oldest submission first (leads). */
export const GET = guardedRoute({ permission: "sheet.review" }, async ({ actor }) => ({ sheets: (await reviewQueue(actor)).map(toSheetRow) }));
