import type { Metadata } from "next";
import type { ReactNode } from "react";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import { DateTime } from "@/components/ui/date-time";
import { PageHeader } from "@/components/ui/page-header";
import { Caution } from "@/components/sheets/results/Caution";
import { listAmpacityTables } from "@/db/queries/ampacity-tables";
import { currentSchedule, listSchedules, type ScheduleDetail } from "@/db/queries/schedules";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { VOLTAGE_DROP_LIMIT_IDS, voltageDropLimit } from "@/lib/engine/voltage-drop";
import { loadProjectOr404 } from "../load";
import { ScheduleErrorList } from "./error-list";
import { ScheduleHistory } from "./history";
import { ScheduleResultsTable } from "./results-table";
import { toTableRow } from "./table-row";
import { ScheduleUploadForm } from "./upload-form";

export const metadata: Metadata = { title: "Cable schedule" };

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="py-1.5 sm:grid sm:grid-cols-3 sm:gap-3">
      <dt className="text-sm text-fen-500">{label}</dt>
      <dd className="text-sm font-medium text-fen-900 sm:col-span-2">{children}</dd>
    </div>
  );
}

function Count({ label, value, tone }: { label: string; value: number; tone?: "pass" | "fail" | "warn" }) {
  const colour = tone === "pass" ? "text-verdigris-700" : tone === "fail" ? "text-signal-700" : tone === "warn" ? "text-amberline-700" : "text-fen-900";
  return (
    <div className="rounded-md border border-fen-200 bg-fen-50 px-3 py-2">
      <p className="text-xs uppercase tracking-wide text-fen-500">{label}</p>
      <p className={`text-2xl font-semibold tabular-nums ${colour}`}>{value.toLocaleString("en-GB")}</p>
    </div>
  );
}

function limitText(s: ScheduleDetail): string {
  const o = s.options as { limitId?: string; limitPercent?: number };
  if (typeof o.limitPercent === "number") return `${o.limitPercent} % (override)`;
  const id = VOLTAGE_DROP_LIMIT_IDS.find((x) => x === o.limitId);
  if (!id) return "—";
  const l = voltageDropLimit(id);
  return id.startsWith("iec-") ? `${l.percent} % — ${l.name} (plus 0.005 %/m beyond 100 m, at most 0.5 %)` : `${l.percent} % — ${l.name}`;
}

function Summary({ s }: { s: ScheduleDetail }) {
  const notices = Array.isArray(s.options.notices) ? (s.options.notices as unknown[]).map(String) : [];
  const passing = s.validCount - s.failCount;
  return (
    <section aria-labelledby="current-heading" className="panel mb-6 p-5">
      <h2 id="current-heading" className="mb-3 text-sm font-semibold uppercase tracking-wider text-fen-600">
        Current schedule
      </h2>
      <div className="mb-4 grid grid-cols-2 gap-3 sm:grid-cols-5">
        <Count label="Rows in file" value={s.rowCount} />
        <Count label="Computed" value={s.validCount} />
        <Count label="Pass" value={passing} tone="pass" />
        <Count label="Fail" value={s.failCount} tone={s.failCount ? "fail" : undefined} />
        <Count label="Row errors" value={s.errorCount} tone={s.errorCount ? "warn" : undefined} />
      </div>
      <dl className="divide-y divide-fen-100">
        <Item label="File">{s.filename}</Item>
        <Item label="File SHA-256">
          <span className="break-all font-mono text-xs">{s.fileSha256}</span>
        </Item>
        <Item label="Ampacity table">
          {s.table ? (
            <>
              {s.table.name} <span className="font-mono">v{s.table.version}</span>
              {s.table.source ? <span className="block text-xs font-normal text-fen-500">{s.table.source}</span> : null}
            </>
          ) : (
            "None: ampacities as given in the file"
          )}
        </Item>
        <Item label="Voltage-drop limit">{limitText(s)}</Item>
        <Item label="Uploaded">
          {s.createdByName} · <DateTime value={s.createdAt} />
        </Item>
        <Item label="Engine and results hash">
          <span className="font-mono text-xs">
            {s.engineVersion} · {s.resultsHash.slice(0, 16)}…
          </span>
        </Item>
      </dl>
      {notices.length ? (
        <ul className="mt-3 space-y-1 rounded-md bg-fen-50 px-3 py-2 text-xs text-fen-700" aria-label="How the file was read">
          {notices.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}

export default async function SchedulePage({ params }: { params: Promise<{ id: string }> }) {
  const actor = await requirePageActor("schedule.read");
  const project = await loadProjectOr404(actor, (await params).id);
  const canUpload = can(actor.role, "schedule.upload") && project.archivedAt === null;
  const [current, history, tables] = await Promise.all([
    currentSchedule(actor.organisationId, project.id),
    listSchedules(actor.organisationId, project.id),
    canUpload ? listAmpacityTables(actor.organisationId, { activeOnly: true }) : Promise.resolve([]),
  ]);
  const base = `/projects/${project.id}/schedule`;
  const limits = VOLTAGE_DROP_LIMIT_IDS.map((id) => {
    const l = voltageDropLimit(id);
    return { id, label: `${l.percent} % — ${l.name}` };
  });
  const defaultLimit = project.standardFamily === "north-american" ? "nec-feeder" : "iec-a-other";

  return (
    <>
      <Breadcrumbs items={[{ label: "Projects", href: "/projects" }, { label: project.code, href: `/projects/${project.id}`, mono: true }, { label: "Cable schedule" }]} />
      <PageHeader
        eyebrow={project.code}
        title="Cable schedule"
        description="Upload the project's feeders as CSV: every row is checked, and each valid row gets its voltage drop, conductor temperature at the load current and ampacity check."
        actions={
          <>
            <a href={`${base}/template`} className="btn-secondary" download>
              Download template
            </a>
            {current ? (
              <a href={`${base}/export`} className="btn-secondary" download>
                Export results (CSV)
              </a>
            ) : null}
          </>
        }
      />
      <Caution className="mb-6" />

      {canUpload ? (
        <section aria-labelledby="upload-heading" className="panel mb-6 p-5">
          <h2 id="upload-heading" className="mb-3 text-sm font-semibold uppercase tracking-wider text-fen-600">
            Upload a schedule
          </h2>
          <ScheduleUploadForm projectId={project.id} tables={tables.map((t) => ({ id: t.id, label: `${t.name} v${t.version} (${t.rowCount} rows)` }))} limits={limits} defaultLimitId={defaultLimit} />
          <details className="mt-4 text-sm text-fen-700">
            <summary className="cursor-pointer font-medium text-fen-800">How the rows are computed</summary>
            <ul className="mt-2 list-disc space-y-1 pl-5 text-fen-600">
              <li>Ampacity: the number in the ampacity column, used as given for one conductor; or, when it is empty and an installation method is filled, the chosen table&apos;s row for the material, insulation and size, corrected for the ambient and the grouping factor. The circuit&apos;s ampacity is that times the number in parallel. A row with neither is listed as an error (no ampacity is assumed).</li>
              <li>Conductor temperature at the load current: θ = θa + (θmax − θa)·(I/Iz)², θmax from the table row or the insulation.</li>
              <li>Voltage drop: the exact phasor method at that conductor temperature, reactance 0.08 mΩ/m, against the limit chosen.</li>
              <li>Empty ambient cells take the project&apos;s design ambient ({project.designAmbientC} °C).</li>
            </ul>
          </details>
        </section>
      ) : null}

      {current ? (
        <>
          <Summary s={current} />
          {current.errors.length ? <ScheduleErrorList errors={current.errors} /> : null}
          <section aria-labelledby="results-heading" className="mb-6">
            <h2 id="results-heading" className="mb-2 text-sm font-semibold uppercase tracking-wider text-fen-600">
              Results
            </h2>
            <ScheduleResultsTable rows={current.results.map(toTableRow)} unitSystem={project.unitSystem} />
          </section>
        </>
      ) : (
        <p className="panel mb-6 p-5 text-sm text-fen-600">
          No cable schedule uploaded yet.{canUpload ? " Download the template, fill in the feeders and upload it above." : ""}
        </p>
      )}

      {history.length ? <ScheduleHistory items={history} base={base} currentId={current?.id ?? null} /> : null}
    </>
  );
}
