import { getProject } from "@/db/queries/projects";
import { currentSchedule, getSchedule } from "@/db/queries/schedules";
import { guardedRoute } from "@/lib/auth/guard";
import { notFound } from "@/lib/errors";
import { resultsCsv } from "@/lib/schedules/export";
import { parseInput } from "@/lib/sheets/common";
import { idField } from "@/lib/sheets/schemas";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * GET /projects/:id/schedule/export[?schedule=<id>] — the results of the current (or the
 * given) schedule as CSV, readable again as a schedule; formula-looking cells neutralised
 * (schedule.read). Another organisation's project or schedule is a 404.
 */
export const GET = guardedRoute<{ id: string }>({ permission: "schedule.read" }, async ({ req, actor, params }) => {
  const projectId = parseInput(idField("Project"), params.id);
  const project = await getProject(actor.organisationId, projectId);
  const raw = new URL(req.url).searchParams.get("schedule");
  const schedule = raw === null ? await currentSchedule(actor.organisationId, projectId) : await getSchedule(actor.organisationId, projectId, parseInput(idField("Schedule"), raw));
  if (!schedule) throw notFound("The project has no cable schedule yet");
  const base = `${project.code}_cable-schedule_${schedule.id}_results`.replace(/[^A-Za-z0-9._-]+/g, "-");
  return new Response(resultsCsv(schedule.results), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${base}.csv"`,
      "x-results-sha256": schedule.resultsHash,
      "cache-control": "private, no-store",
    },
  });
});
