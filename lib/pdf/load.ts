import "server-only";
import { getProject } from "@/db/queries/projects";
import { currentSchedule } from "@/db/queries/schedules";
import { organisationBranding } from "@/db/queries/uploads";
import type { Actor } from "@/lib/auth/guard";
import type { CalcResult } from "@/lib/engine/core/result";
import { VOLTAGE_DROP_LIMIT_IDS, voltageDropLimit } from "@/lib/engine/voltage-drop";
import { env } from "@/lib/env";
import { getRevision, getSheet, type SheetDetail } from "@/lib/sheets/reads";
import type { RevisionDetail } from "@/db/queries/sheets";
import type { SchedulePdfData } from "./schedule-pages";
import { isStamped } from "./sheet-pages";
import type { PdfOrganisation, PdfProject, SheetPdfData } from "./types";
import { verificationCode, verificationUrl } from "./verification-code";

/** Gathers what a sheet's PDF prints, through the guarded read functions (404 for another organisation). */

export async function pdfOrganisation(organisationId: number): Promise<PdfOrganisation> {
  const b = await organisationBranding(organisationId);
  const format = b.logo?.contentType === "image/png" ? "png" : "jpg";
  return { name: b.name, logo: b.logo ? { base64: b.logo.data.toString("base64"), format } : null };
}

export async function pdfProject(organisationId: number, projectId: number): Promise<PdfProject> {
  const p = await getProject(organisationId, projectId);
  return { code: p.code, name: p.name, client: p.client ?? "", site: p.site ?? "", unitSystem: p.unitSystem };
}

export function toSheetPdfData(sheet: Pick<SheetDetail, "id" | "tag" | "title" | "kind" | "kindTitle">, rev: RevisionDetail, organisation: PdfOrganisation, project: PdfProject): SheetPdfData {
  const code = isStamped(rev.status) ? verificationCode(rev.contentHash, sheet.id, rev.ordinal) : null;
  return {
    organisation,
    project,
    sheet: { id: sheet.id, tag: sheet.tag, title: sheet.title, kind: sheet.kind, kindTitle: sheet.kindTitle },
    revision: {
      ordinal: rev.ordinal,
      label: rev.label,
      status: rev.status,
      authorName: rev.authorName,
      checkedByName: rev.checkedByName,
      createdAt: rev.createdAt,
      submittedAt: rev.submittedAt,
      decidedAt: rev.decidedAt,
      engineVersion: rev.engineVersion,
      contentHash: rev.contentHash,
      inputs: rev.inputs,
      results: (rev.results as unknown as CalcResult<unknown> | null) ?? null,
    },
    verification: code ? { code, url: verificationUrl(env().APP_URL, code) } : null,
  };
}

/** The latest revision, or the one with the given ordinal. */
export async function loadSheetPdfData(actor: Actor, sheetId: unknown, ordinal?: unknown): Promise<SheetPdfData> {
  const sheet = await getSheet(actor, sheetId);
  const rev = ordinal === undefined || ordinal === null ? sheet.current : await getRevision(actor, sheet.id, ordinal);
  const [organisation, project] = await Promise.all([pdfOrganisation(actor.organisationId), pdfProject(actor.organisationId, sheet.projectId)]);
  return toSheetPdfData(sheet, rev, organisation, project);
}

/** The project's current cable schedule as the package prints it, or null when none was uploaded. */
export async function pdfSchedule(organisationId: number, projectId: number): Promise<SchedulePdfData | null> {
  const sc = await currentSchedule(organisationId, projectId);
  if (!sc) return null;
  const o = sc.options as { limitId?: unknown; limitPercent?: unknown };
  const limitId = VOLTAGE_DROP_LIMIT_IDS.find((x) => x === o.limitId);
  const limit = typeof o.limitPercent === "number" ? `${o.limitPercent} % (override)` : limitId ? `${voltageDropLimit(limitId).percent} % — ${voltageDropLimit(limitId).name}` : "—";
  return {
    id: sc.id,
    filename: sc.filename,
    fileSha256: sc.fileSha256,
    resultsHash: sc.resultsHash,
    engineVersion: sc.engineVersion,
    uploadedBy: sc.createdByName,
    uploadedAt: sc.createdAt,
    table: sc.table ? { name: sc.table.name, version: sc.table.version, source: sc.table.source } : null,
    limit,
    rowCount: sc.rowCount,
    validCount: sc.validCount,
    failCount: sc.failCount,
    results: sc.results,
    errors: sc.errors,
  };
}
