import type { ScheduleError } from "@/lib/schedules/types";

/** The rows that could not be computed, each error naming its row and column. */
export function ScheduleErrorList({ errors }: { errors: readonly ScheduleError[] }) {
  const rows = new Set(errors.filter((e) => e.row > 0).map((e) => e.row)).size;
  return (
    <section aria-labelledby="errors-heading" className="panel mb-6 border-amberline-500/50 p-5">
      <h2 id="errors-heading" className="mb-1 text-sm font-semibold uppercase tracking-wider text-amberline-700">
        Row errors
      </h2>
      <p className="mb-3 text-sm text-fen-600">
        {rows} row{rows === 1 ? "" : "s"} could not be computed and {rows === 1 ? "is" : "are"} left out of the results. Correct them in the file and upload it again.
      </p>
      <ol className="max-h-80 space-y-1 overflow-y-auto text-sm" aria-label="Errors by row">
        {errors.map((e, i) => (
          <li key={i} className="flex gap-3 border-b border-fen-100 pb-1 last:border-0">
            <span className="w-16 shrink-0 font-mono text-xs text-fen-500">{e.row > 0 ? `row ${e.row}` : "file"}</span>
            <span className="text-fen-800">{e.message}</span>
          </li>
        ))}
      </ol>
    </section>
  );
}
