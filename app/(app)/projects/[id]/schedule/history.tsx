import { DateTime } from "@/components/ui/date-time";
import type { ScheduleSummary } from "@/db/queries/schedules";

/** Every upload of the project's schedule, newest first, each downloadable as uploaded. */
export function ScheduleHistory({ items, base, currentId }: { items: readonly ScheduleSummary[]; base: string; currentId: number | null }) {
  return (
    <section aria-labelledby="history-heading" className="panel mb-6 p-5">
      <h2 id="history-heading" className="mb-3 text-sm font-semibold uppercase tracking-wider text-fen-600">
        Uploads
      </h2>
      <div className="overflow-x-auto">
        <table className="data-table">
          <caption className="sr-only">Uploaded cable schedules</caption>
          <thead>
            <tr>
              <th>File</th>
              <th>Uploaded</th>
              <th>By</th>
              <th className="text-right">Rows</th>
              <th className="text-right">Computed</th>
              <th className="text-right">Failing</th>
              <th className="text-right">Errors</th>
              <th>Table</th>
              <th>SHA-256</th>
              <th>
                <span className="sr-only">Downloads</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {items.map((s) => (
              <tr key={s.id}>
                <td className="font-medium">
                  {s.filename}
                  {s.id === currentId ? <span className="badge ml-2 bg-copper-100 text-copper-700">current</span> : null}
                </td>
                <td className="whitespace-nowrap">
                  <DateTime value={s.createdAt} />
                </td>
                <td>{s.createdByName}</td>
                <td className="text-right tabular-nums">{s.rowCount}</td>
                <td className="text-right tabular-nums">{s.validCount}</td>
                <td className="text-right tabular-nums">{s.failCount}</td>
                <td className="text-right tabular-nums">{s.errorCount}</td>
                <td>{s.table ? `${s.table.name} v${s.table.version}` : "—"}</td>
                <td className="font-mono text-xs text-fen-500" title={s.fileSha256}>
                  {s.fileSha256.slice(0, 12)}…
                </td>
                <td className="whitespace-nowrap">
                  <a href={`${base}/file?schedule=${s.id}`} className="text-copper-700 hover:underline" download>
                    File as uploaded
                  </a>
                  <span aria-hidden="true" className="mx-1 text-fen-300">
                    |
                  </span>
                  <a href={`${base}/export?schedule=${s.id}`} className="text-copper-700 hover:underline" download>
                    Results CSV
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
