import { scheduleFile } from "@/db/queries/schedules";
import { guardedRoute } from "@/lib/auth/guard";
import { parseInput } from "@/lib/sheets/common";
import { idField } from "@/lib/sheets/schemas";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /projects/:id/schedule/file?schedule=<id> — an uploaded schedule, byte for byte as uploaded (schedule.read). */
export const GET = guardedRoute<{ id: string }>({ permission: "schedule.read" }, async ({ req, actor, params }) => {
  const projectId = parseInput(idField("Project"), params.id);
  const scheduleId = parseInput(idField("Schedule"), new URL(req.url).searchParams.get("schedule") ?? "");
  const f = await scheduleFile(actor.organisationId, projectId, scheduleId);
  const name = f.filename.replace(/[^A-Za-z0-9._-]+/g, "-");
  return new Response(new Uint8Array(f.data), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${name}"`,
      "content-length": String(f.data.length),
      "x-content-sha256": f.sha256,
      "cache-control": "private, no-store",
    },
  });
});
