import "server-only";
// Installs the bearer-token resolver in this route's module graph (idempotent).
import "@/lib/auth/tokens";
import type { SheetListItem } from "@/db/queries/sheets";
import type { Actor } from "@/lib/auth/guard";
import { isCalcKind, runCalc } from "@/lib/engine";
export { parseOrdinal, parseRouteId } from "./ids";
import { getSheet, type RevisionDetail, type RevisionSummary, type SheetDetail } from "@/lib/sheets/service";

/**
 * How the JSON API shows sheets and revisions: plain objects with ISO dates, people as
 * { id, name }, never more than the caller's organisation holds.
 */

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function revisionSummaryJson(r: RevisionSummary) {
  return {
    id: r.id,
    ordinal: r.ordinal,
    label: r.label,
    status: r.status,
    author: { id: r.authorId, name: r.authorName },
    checkedBy: r.checkedById !== null ? { id: r.checkedById, name: r.checkedByName ?? "" } : null,
    submittedAt: iso(r.submittedAt),
    decidedAt: iso(r.decidedAt),
    reviewComment: r.reviewComment,
    engineVersion: r.engineVersion,
    contentHash: r.contentHash,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

/** A revision with its content; while the inputs are invalid, their field errors. */
export function revisionJson(r: RevisionDetail, kind: string) {
  let inputErrors: Record<string, string> | null = null;
  if (r.results === null) {
    const out = isCalcKind(kind) ? runCalc(kind, r.inputs) : { ok: false as const, fields: { kind: `Unknown calculation kind "${kind}"` } };
    inputErrors = out.ok ? null : out.fields;
  }
  return { ...revisionSummaryJson(r), inputs: r.inputs, results: r.results, inputErrors };
}

export function sheetSummaryJson(s: SheetListItem) {
  return {
    id: s.id,
    projectId: s.projectId,
    kind: s.kind,
    tag: s.tag,
    title: s.title,
    position: s.position,
    version: s.version,
    revision: { id: s.revisionId, ordinal: s.ordinal, label: s.label, status: s.status },
    author: { id: s.authorId, name: s.authorName },
    checkedBy: s.checkedByName !== null ? { name: s.checkedByName } : null,
    approvedLabel: s.approvedLabel,
    submittedAt: iso(s.submittedAt),
    decidedAt: iso(s.decidedAt),
    updatedAt: s.updatedAt.toISOString(),
  };
}

/** A sheet with its latest revision (content included) and all revisions; 404 outside the organisation. */
export function sheetJson(d: SheetDetail) {
  return {
    id: d.id,
    projectId: d.projectId,
    projectCode: d.projectCode,
    projectName: d.projectName,
    kind: d.kind,
    kindTitle: d.kindTitle,
    tag: d.tag,
    title: d.title,
    position: d.position,
    version: d.version,
    approvedLabel: d.approved?.label ?? null,
    createdAt: d.createdAt.toISOString(),
    updatedAt: d.updatedAt.toISOString(),
    latest: { ...revisionSummaryJson(d.current), inputs: d.current.inputs, results: d.current.results, inputErrors: d.currentInputErrors },
    revisions: d.revisions.map(revisionSummaryJson),
  };
}

export async function loadSheetJson(actor: Actor, sheetId: number) {
  return sheetJson(await getSheet(actor, sheetId));
}
