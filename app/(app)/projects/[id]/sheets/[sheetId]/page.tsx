import type { Metadata } from "next";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import Link from "next/link";
import { SheetEditor } from "@/components/sheets/editor/sheet-editor";
import { SheetStatusBadge } from "@/components/sheets/editor/status";
import { PageHeader } from "@/components/ui/page-header";
import { revisionSchemeOf } from "@/db/queries/sheets";
import { db } from "@/db/client";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import type { CalcResult } from "@/lib/engine/core/result";
import { sheetKindName } from "@/lib/sheets/kinds";
import { revisionLabel } from "@/lib/sheets/revision-label";
import { FORM_SEGMENT_LIMIT, segmentCount } from "@/lib/sheets/network-import";
import { EDITABLE_STATUSES } from "@/lib/sheets/workflow";
import { getRevision, listProjectSheets, sheetHistory } from "@/lib/sheets/service";
import { SheetHistory } from "./history";
import { loadSheetOr404, or404 } from "./load";
import { lossSourcesFor } from "./loss-sources";
import { ImportNetworkForm } from "./import-network-form";
import { LargeNetworkSummary } from "./large-network";

export const metadata: Metadata = { title: "Sheet" };

export default async function SheetPage({ params, searchParams }: { params: Promise<{ id: string; sheetId: string }>; searchParams: Promise<{ rev?: string | string[] }> }) {
  const actor = await requirePageActor("sheet.read");
  const { id, sheetId } = await params;
  const { sheet, project } = await loadSheetOr404(actor, id, sheetId);
  const revParam = (await searchParams).rev;
  const latest = sheet.current;
  const wanted = typeof revParam === "string" && /^\d{1,6}$/.test(revParam) ? Number(revParam) : latest.ordinal;
  const shown = wanted === latest.ordinal ? latest : await or404(getRevision(actor, sheet.id, wanted));
  const isLatest = shown.ordinal === latest.ordinal;

  const [history, scheme, projectSheets, lossSources] = await Promise.all([
    sheetHistory(actor, sheet.id),
    revisionSchemeOf(db(), actor.organisationId),
    listProjectSheets(actor, sheet.projectId),
    sheet.kind === "enclosure-heat" && isLatest ? lossSourcesFor(actor, sheet.projectId, sheet.id) : Promise.resolve([]),
  ]);
  const base = `/projects/${project.id}/sheets/${sheet.id}`;

  // Bus networks: a file import beside the form; a network too large for the form is shown as a summary of its stored result.
  const network = sheet.kind === "bus-network";
  const large = network && segmentCount(shown.inputs) > FORM_SEGMENT_LIMIT;
  const canImport =
    isLatest &&
    !sheet.projectArchived &&
    can(actor.role, "sheet.write") &&
    (shown.status === "approved" || (EDITABLE_STATUSES.includes(shown.status) && shown.authorId === actor.id));
  const importForm = network ? (
    <ImportNetworkForm
      projectId={project.id}
      sheetId={sheet.id}
      version={sheet.version}
      canImport={canImport}
      downloadHref={`${base}/network${isLatest ? "" : `?rev=${shown.ordinal}`}`}
      replacesUnsaved={!large}
    />
  ) : null;
  // An import replaces the form's contents: the editor starts afresh after one.
  const imports = network ? history.filter((h) => h.event === "network.imported").length : 0;

  return (
    <>
      <Breadcrumbs items={[{ label: "Projects", href: "/projects" }, { label: project.code, href: `/projects/${project.id}`, mono: true }, { label: sheet.tag, mono: true }]} />
      <PageHeader
        eyebrow={`${sheet.tag} · ${sheetKindName(sheet.kind)}`}
        title={sheet.title}
        description={
          <>
            {project.name} · revision {shown.label} by {shown.authorName}
            {shown.checkedByName ? `, checked by ${shown.checkedByName}` : ""}
            {sheet.approved ? ` · revision in force: ${sheet.approved.label}` : " · no approved revision yet"}
          </>
        }
        actions={
          <>
            <a href={`/api/v1/sheets/${sheet.id}/pdf?rev=${shown.ordinal}`} className="btn-secondary" download>
              Download PDF
            </a>
            {sheet.revisions.length > 1 ? (
              <Link href={`${base}/revisions`} className="btn-secondary">
                Compare revisions
              </Link>
            ) : null}
          </>
        }
      />

      {sheet.revisions.length > 1 ? (
        <nav aria-label="Revisions" className="mb-4 flex flex-wrap items-center gap-2 text-sm">
          <span className="text-fen-500">Revisions:</span>
          {sheet.revisions.map((r) => {
            const current = r.ordinal === shown.ordinal;
            return (
              <Link
                key={r.id}
                href={r.ordinal === latest.ordinal ? base : `${base}?rev=${r.ordinal}`}
                aria-current={current ? "page" : undefined}
                className={`inline-flex items-center gap-1.5 rounded-md border px-2 py-1 ${current ? "border-copper-400 bg-copper-50" : "border-fen-200 bg-white hover:bg-fen-100"}`}
              >
                <span className="font-mono font-semibold">Rev {r.label}</span>
                <SheetStatusBadge status={r.status} />
              </Link>
            );
          })}
        </nav>
      ) : null}

      <SheetEditor
        key={`${shown.ordinal}-${isLatest}-${imports}`}
        sheet={{ id: sheet.id, projectId: sheet.projectId, kind: sheet.kind, tag: sheet.tag, title: sheet.title, version: sheet.version }}
        revision={{
          ordinal: shown.ordinal,
          label: shown.label,
          status: shown.status,
          authorId: shown.authorId,
          authorName: shown.authorName,
          checkedByName: shown.checkedByName,
          reviewComment: shown.reviewComment,
          isLatest,
        }}
        inputs={large ? {} : shown.inputs}
        savedResult={large ? null : ((shown.results as unknown as CalcResult<unknown> | null) ?? null)}
        unitSystem={project.unitSystem}
        viewer={{
          id: actor.id,
          role: actor.role,
          canWrite: can(actor.role, "sheet.write"),
          canSubmit: can(actor.role, "sheet.submit"),
          canReview: can(actor.role, "sheet.review"),
        }}
        nextLabel={revisionLabel(latest.ordinal + 1, scheme)}
        projectArchived={sheet.projectArchived}
        takenTags={projectSheets.map((s) => s.tag)}
        lossSources={lossSources}
        summary={
          large ? (
            <LargeNetworkSummary
              inputs={shown.inputs}
              result={(shown.results as unknown as CalcResult<unknown> | null) ?? null}
              revisionId={shown.id}
              history={history}
              unitSystem={project.unitSystem}
              importForm={importForm}
            />
          ) : undefined
        }
      />
      {network && !large ? <div className="mt-6">{importForm}</div> : null}

      <div className="mt-8">
        <SheetHistory entries={history} />
      </div>
    </>
  );
}
