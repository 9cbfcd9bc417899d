import Link from "next/link";
import { currentScheduleSummary } from "@/db/queries/schedules";

/** The project page's small cable-schedule panel: the current schedule's counts and the way to the schedule page. */
export async function ScheduleSummaryPanel({ projectId, organisationId }: { projectId: number; organisationId: number }) {
  const s = await currentScheduleSummary(organisationId, projectId);
  return (
    <section aria-labelledby="schedule-panel-heading" className="panel mb-6 flex flex-wrap items-center justify-between gap-3 p-5">
      <div>
        <h2 id="schedule-panel-heading" className="text-sm font-semibold uppercase tracking-wider text-fen-600">
          Cable schedule
        </h2>
        {s ? (
          <p className="mt-1 text-sm text-fen-700">
            {s.filename}: {s.rowCount} rows, {s.validCount - s.failCount} pass,{" "}
            <span className={s.failCount ? "font-semibold text-signal-700" : ""}>{s.failCount} fail</span>
            {s.errorCount ? <span className="text-amberline-700">, {s.errorCount} row errors</span> : null}
          </p>
        ) : (
          <p className="mt-1 text-sm text-fen-500">No schedule uploaded yet.</p>
        )}
      </div>
      <Link href={`/projects/${projectId}/schedule`} className="btn-secondary">
        {s ? "Open cable schedule" : "Cable schedule"}
      </Link>
    </section>
  );
}
