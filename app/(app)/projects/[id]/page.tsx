import type { Metadata } from "next";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import Link from "next/link";
import type { ReactNode } from "react";
import { DateTime } from "@/components/ui/date-time";
import { PageHeader } from "@/components/ui/page-header";
import { ProjectStateBadge } from "@/components/ui/status-badge";
import { listProjectAudit, type ProjectDetail } from "@/db/queries/projects";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { cToF, mToFt, STANDARD_FAMILY_LABELS, SYSTEM_TYPE_LABELS, tidy } from "@/lib/validation/project";
import { ProjectSheetsTable } from "@/components/sheets/project-sheets-table";
import { toSheetRow } from "@/components/sheets/sheet-row";
import { listProjectSheets } from "@/lib/sheets/reads";
import { ArchiveButton } from "./archive-button";
import { AuditHistory } from "./audit-history";
import { loadProjectOr404 } from "./load";
import { PackagePanel } from "./package-panel";
import { ScheduleSummaryPanel } from "./schedule/summary-panel";

export const metadata: Metadata = { title: "Project" };

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="py-2 sm:grid sm:grid-cols-5 sm:gap-4">
      <dt className="text-sm text-fen-500 sm:col-span-2">{label}</dt>
      <dd className="text-sm font-medium text-fen-900 sm:col-span-3">{children}</dd>
    </div>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="panel p-5">
      <h2 className="mb-2 text-xs font-semibold uppercase tracking-wider text-fen-500">{title}</h2>
      <dl className="divide-y divide-fen-100">{children}</dl>
    </section>
  );
}

/** Ambient and altitude in the project's units, with the SI value beside imperial ones. */
function environment(p: ProjectDetail) {
  if (p.unitSystem === "imperial") {
    return {
      ambient: `${tidy(cToF(p.designAmbientC), 1)} °F (${tidy(p.designAmbientC, 1)} °C)`,
      altitude: `${tidy(mToFt(p.altitudeM), 0)} ft (${tidy(p.altitudeM, 0)} m)`,
    };
  }
  return { ambient: `${tidy(p.designAmbientC, 1)} °C`, altitude: `${tidy(p.altitudeM, 0)} m` };
}

export default async function ProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const actor = await requirePageActor("project.read");
  const project = await loadProjectOr404(actor, (await params).id);
  const history = await listProjectAudit(actor.organisationId, project.id, 20);
  const sheetRows = (await listProjectSheets(actor, project.id)).map(toSheetRow);
  const env = environment(project);
  const archived = project.archivedAt !== null;

  return (
    <>
      <Breadcrumbs items={[{ label: "Projects", href: "/projects" }, { label: project.code, mono: true }]} />
      <PageHeader
        eyebrow={
          <span className="inline-flex items-center gap-2">
            {project.code} <ProjectStateBadge archivedAt={project.archivedAt} />
          </span>
        }
        title={project.name}
        description={[project.client, project.site].filter(Boolean).join(" · ") || undefined}
        actions={
          <>
            {can(actor.role, "sheet.write") && !archived && (
              <Link href={`/projects/${project.id}/sheets/new`} className="btn-primary">
                New sheet
              </Link>
            )}
            {can(actor.role, "project.write") && !archived && (
              <Link href={`/projects/${project.id}/edit`} className="btn-secondary">
                Edit project
              </Link>
            )}
            {can(actor.role, "project.archive") && <ArchiveButton id={project.id} code={project.code} archived={archived} />}
          </>
        }
      />

      {archived && (
        <p role="status" className="mb-6 rounded-lg border border-fen-200 bg-fen-100 px-4 py-3 text-sm text-fen-700">
          Archived on <DateTime value={project.archivedAt!} />. It is kept read-only and hidden from the project list unless archived projects are shown.
        </p>
      )}

      <section aria-labelledby="sheets-heading" className="mb-6">
        <h2 id="sheets-heading" className="mb-2 text-sm font-semibold uppercase tracking-wider text-fen-600">
          Calculation sheets
        </h2>
        <ProjectSheetsTable rows={sheetRows} caption={`Calculation sheets of ${project.code}`} />
      </section>

      <PackagePanel projectId={project.id} organisationId={actor.organisationId} canIssue={can(actor.role, "project.write") && !archived} />

      <ScheduleSummaryPanel projectId={project.id} organisationId={actor.organisationId} />

      <div className="grid gap-6 lg:grid-cols-3">
        <div className="space-y-6 lg:col-span-2">
          <div className="grid gap-6 md:grid-cols-2">
            <Section title="Supply system">
              <Item label="System voltage">
                {project.systemVoltage} V {project.systemType === "dc" ? "DC" : "AC"}
              </Item>
              <Item label="System type">{SYSTEM_TYPE_LABELS[project.systemType]}</Item>
              <Item label="Frequency">{project.frequency === 0 ? "DC" : `${project.frequency} Hz`}</Item>
              <Item label="Earthing arrangement">{project.earthing}</Item>
            </Section>
            <Section title="Design basis">
              <Item label="Standard family">{STANDARD_FAMILY_LABELS[project.standardFamily]}</Item>
              <Item label="Unit system">{project.unitSystem === "imperial" ? "Imperial" : "Metric"}</Item>
              <Item label="Design ambient temperature">{env.ambient}</Item>
              <Item label="Altitude">{env.altitude}</Item>
            </Section>
          </div>
          <section className="panel p-5">
            <h2 className="mb-2 text-xs font-semibold uppercase tracking-wider text-fen-500">Notes</h2>
            {project.notes ? (
              <p className="whitespace-pre-wrap text-sm text-fen-800">{project.notes}</p>
            ) : (
              <p className="text-sm text-fen-400">No notes.</p>
            )}
          </section>
          <Section title="Record">
            <Item label="Client">{project.client || "—"}</Item>
            <Item label="Site">{project.site || "—"}</Item>
            <Item label="Created by">{project.createdByName}</Item>
            <Item label="Created">
              <DateTime value={project.createdAt} />
            </Item>
            <Item label="Last saved">
              <DateTime value={project.updatedAt} />
            </Item>
            <Item label="Version">{project.version}</Item>
          </Section>
        </div>
        <AuditHistory entries={history} />
      </div>
    </>
  );
}
