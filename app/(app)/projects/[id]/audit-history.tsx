import { DateTime } from "@/components/ui/date-time";
import type { ProjectAuditEntry } from "@/db/queries/projects";

const EVENT_LABELS: Partial<Record<ProjectAuditEntry["event"], string>> = {
  "project.created": "Created the project",
  "project.updated": "Saved changes",
  "project.archived": "Archived the project",
  "project.restored": "Restored the project",
  "package.issued": "Issued a calculation package",
  "schedule.uploaded": "Uploaded a cable schedule",
};

const FIELD_LABELS: Record<string, string> = {
  code: "project code",
  name: "name",
  client: "client",
  site: "site",
  systemVoltage: "system voltage",
  systemType: "system type",
  frequency: "frequency",
  earthing: "earthing arrangement",
  designAmbient: "design ambient temperature",
  altitude: "altitude",
  standardFamily: "standard family",
  unitSystem: "unit system",
  notes: "notes",
};

function changedFields(details: Record<string, unknown>): string | null {
  const changed = details.changed;
  if (!Array.isArray(changed)) return null;
  if (changed.length === 0) return "no field changed";
  return changed.map((f) => FIELD_LABELS[String(f)] ?? String(f)).join(", ");
}

/** The project's latest audit events, newest first. */
export function AuditHistory({ entries }: { entries: ProjectAuditEntry[] }) {
  return (
    <section aria-labelledby="history-heading" className="panel self-start p-5">
      <h2 id="history-heading" className="mb-3 text-xs font-semibold uppercase tracking-wider text-fen-500">
        History
      </h2>
      {entries.length === 0 ? (
        <p className="text-sm text-fen-400">No recorded events.</p>
      ) : (
        <ol className="relative space-y-4 border-l border-fen-200 pl-4">
          {entries.map((e) => {
            const fields = changedFields(e.details);
            return (
              <li key={e.id} className="relative">
                <span aria-hidden="true" className="absolute -left-[1.3rem] top-1.5 h-2 w-2 rounded-full bg-copper-500 ring-2 ring-white" />
                <p className="text-sm text-fen-900">
                  <span className="font-medium">{e.actorName ?? "Someone"}</span> · {EVENT_LABELS[e.event] ?? e.event}
                </p>
                {fields && <p className="text-xs text-fen-600">Changed: {fields}</p>}
                <p className="text-xs text-fen-500">
                  <DateTime value={e.createdAt} />
                </p>
              </li>
            );
          })}
        </ol>
      )}
      {entries.length === 20 && <p className="mt-4 text-xs text-fen-400">Showing the latest 20 events.</p>}
    </section>
  );
}
