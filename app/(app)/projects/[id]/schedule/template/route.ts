import { guardedRoute } from "@/lib/auth/guard";
import { templateCsv } from "@/lib/schedules/export";

export const dynamic = "force-dynamic";

/** GET /projects/:id/schedule/template — the CSV template: the header with units and two example feeders (schedule.read). */
export const GET = guardedRoute({ permission: "schedule.read" }, async () => {
  return new Response(templateCsv(), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": 'attachment; filename="cable-schedule-template.csv"',
      "cache-control": "private, no-store",
    },
  });
});
