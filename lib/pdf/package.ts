import "server-only";
import { listProjectPackages, storePackage } from "@/db/queries/uploads";
import type { Actor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { forbidden, validationError } from "@/lib/errors";
import { getRevision, getSheet, listProjectSheets } from "@/lib/sheets/reads";
import { parseInput } from "@/lib/sheets/common";
import { idField } from "@/lib/sheets/schemas";
import { pdfOrganisation, pdfProject, pdfSchedule, toSheetPdfData } from "./load";
import type { PackageInfo } from "./package-pages";
import { renderPackage } from "./package-render";

export { renderPackage };
import { pdfFilename } from "./render";
import type { SheetPdfData } from "./types";

/**
 * Issues a project's calculation package: every sheet's revision in force (approved),
 * in project order, and optionally the latest revision of sheets not yet approved
 * (watermarked DRAFT). Rendered in a worker thread (renderPackage: the index refers to
 * where each part starts), stored byte for byte with its SHA-256
 * and recorded as package.issued.
 */
export interface IssuedPackageResult {
  uploadId: number;
  sha256: string;
  filename: string;
  label: string;
  sheetCount: number;
}

const yieldToEventLoop = () => new Promise<void>((r) => setImmediate(r));

/** The sheets a package prints (revision in force, or the latest draft when drafts are included). */
export async function packageSheets(actor: Actor, projectId: number, includeDrafts: boolean): Promise<SheetPdfData[]> {
  const list = await listProjectSheets(actor, projectId);
  const [organisation, project] = await Promise.all([pdfOrganisation(actor.organisationId), pdfProject(actor.organisationId, projectId)]);
  const out: SheetPdfData[] = [];
  for (const row of list) {
    if (!row.approvedLabel && !includeDrafts) continue;
    const sheet = await getSheet(actor, row.id);
    const rev = sheet.approved ? await getRevision(actor, sheet.id, sheet.approved.ordinal) : sheet.current;
    out.push(toSheetPdfData(sheet, rev, organisation, project));
    // Reading 50 sheets is many small queries: let other requests in between.
    await yieldToEventLoop();
  }
  return out;
}

export async function issuePackage(actor: Actor, rawProjectId: unknown, opts: { includeDrafts: boolean }): Promise<IssuedPackageResult> {
  if (!can(actor.role, "project.write")) throw forbidden();
  const projectId = parseInput(idField("Project"), rawProjectId);
  const sheets = await packageSheets(actor, projectId, opts.includeDrafts);
  if (sheets.length === 0) {
    throw validationError(
      { includeDrafts: opts.includeDrafts ? "The project has no sheets yet" : "No sheet of the project is approved yet: approve sheets first, or include drafts" },
      "Nothing to put in the package",
    );
  }
  const [previous, schedule] = await Promise.all([listProjectPackages(actor.organisationId, projectId), pdfSchedule(actor.organisationId, projectId)]);
  const label = `P${previous.length + 1}`;
  const info: PackageInfo = {
    organisation: sheets[0]!.organisation,
    project: sheets[0]!.project,
    label,
    issuedAt: new Date(),
    issuedBy: actor.name,
    includesDrafts: sheets.some((d) => d.revision.status !== "approved" && d.revision.status !== "superseded"),
    sheets,
    schedule,
  };
  const { pdf } = await renderPackage(info);
  const filename = pdfFilename(info.project.code, "calculation-package", label);
  const stored = await storePackage(actor, projectId, {
    filename,
    data: pdf,
    label,
    sheetCount: sheets.length,
    includesDrafts: info.includesDrafts,
    sheets: sheets.map((d) => `${d.sheet.tag} rev ${d.revision.label}`),
    schedule: schedule ? { id: schedule.id, filename: schedule.filename, fileSha256: schedule.fileSha256, resultsHash: schedule.resultsHash } : null,
  });
  return { uploadId: stored.uploadId, sha256: stored.sha256, filename, label, sheetCount: sheets.length };
}
