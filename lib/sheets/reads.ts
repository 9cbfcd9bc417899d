import "server-only";
import { z } from "zod";
import { db } from "@/db/client";
import type { AuditEvent } from "@/db/schema";
import {
  findProject,
  findRevision,
  findSheet,
  listAuthoredBy,
  listInReview,
  listRevisions,
  listSheetAudit,
  listSheetsOfProject,
  type RevisionDetail,
  type RevisionSummary,
  type SheetWithProject,
} from "@/db/queries/sheets";
import type { Actor } from "@/lib/auth/guard";
import { CALC_KINDS, isCalcKind, runCalc } from "@/lib/engine";
import { notFound } from "@/lib/errors";
import { diffJson, type JsonChange } from "./diff";
import { diffRevisionsSchema, idField, ordinalField } from "./schemas";
import { parseInput, PROJECT_NOT_FOUND, requirePermission, SHEET_NOT_FOUND } from "./common";

/**
 * The read side of calculation sheets. Every function needs `sheet.read` (all roles,
 * viewers included) and sees only the actor's organisation: another organisation's
 * sheet, project or revision is a 404. Ids arrive as numbers or numeric strings;
 * anything else is a 400 naming the field.
 */

/** Row and revision shapes the read functions return (defined with their queries). */
export type { RevisionDetail, RevisionSummary, SheetWithProject };

const requireRead = (actor: Actor) => requirePermission(actor, "sheet.read");

/** A sheet with its whole revision history and its latest revision's content. */
export interface SheetDetail {
  id: number;
  projectId: number;
  projectCode: string;
  projectName: string;
  projectArchived: boolean;
  kind: string;
  /** The calculation kind's title ("Enclosure heat budget"), or the kind itself if unknown. */
  kindTitle: string;
  tag: string;
  title: string;
  position: number;
  /** Send it back with the next save or transition (optimistic locking). */
  version: number;
  createdAt: Date;
  updatedAt: Date;
  /** Every revision, oldest first, with author and checker names and dates. */
  revisions: RevisionSummary[];
  /** The latest revision with its inputs and results (what the editor shows). */
  current: RevisionDetail;
  /** Field errors of the latest revision's inputs, or null when they are valid. */
  currentInputErrors: Record<string, string> | null;
  /** The newest approved revision (the one in force), or null. */
  approved: RevisionSummary | null;
}

/** The sheet with all revisions. Errors: 400 bad id; 404 not in the actor's organisation. */
export async function getSheet(actor: Actor, sheetId: unknown): Promise<SheetDetail> {
  requireRead(actor);
  const id = parseInput(idField("Sheet"), sheetId);
  const sheet = await findSheet(db(), actor.organisationId, id);
  if (!sheet) throw notFound(SHEET_NOT_FOUND);
  const [project, revisions] = await Promise.all([findProject(db(), actor.organisationId, sheet.projectId), listRevisions(actor.organisationId, sheet.id)]);
  const last = revisions[revisions.length - 1];
  const current = last ? await findRevision(actor.organisationId, sheet.id, last.ordinal) : null;
  if (!project || !current) throw notFound(SHEET_NOT_FOUND);
  const outcome = current.results ? null : runCalc(sheet.kind, current.inputs);
  const approved = [...revisions].reverse().find((r) => r.status === "approved") ?? null;
  return {
    id: sheet.id,
    projectId: sheet.projectId,
    projectCode: project.code,
    projectName: project.name,
    projectArchived: project.archivedAt !== null,
    kind: sheet.kind,
    kindTitle: isCalcKind(sheet.kind) ? CALC_KINDS[sheet.kind].title : sheet.kind,
    tag: sheet.tag,
    title: sheet.title,
    position: sheet.position,
    version: sheet.version,
    createdAt: sheet.createdAt,
    updatedAt: sheet.updatedAt,
    revisions,
    current,
    currentInputErrors: outcome && !outcome.ok ? outcome.fields : null,
    approved,
  };
}

/**
 * The project's sheets in order, each with its latest revision's label, status, author,
 * checker, the label in force (newest approved) and the last update.
 * Errors: 400 bad id; 404 project not in the actor's organisation.
 */
export async function listProjectSheets(actor: Actor, projectId: unknown): Promise<SheetWithProject[]> {
  requireRead(actor);
  const id = parseInput(idField("Project"), projectId);
  const project = await findProject(db(), actor.organisationId, id);
  if (!project) throw notFound(PROJECT_NOT_FOUND);
  return listSheetsOfProject(actor.organisationId, project.id);
}

/** Sheets of the organisation waiting for a check, excluding the actor's own; oldest submission first. */
export async function reviewQueue(actor: Actor): Promise<SheetWithProject[]> {
  requireRead(actor);
  return listInReview(actor.organisationId, actor.id);
}

/** Sheets whose latest revision the actor authored (drafts, in review, returned, approved); recently changed first. */
export async function mySheets(actor: Actor): Promise<SheetWithProject[]> {
  requireRead(actor);
  return listAuthoredBy(actor.organisationId, actor.id);
}

/** One revision with inputs and results. Errors: 400 bad id/ordinal; 404 sheet or revision not found. */
export async function getRevision(actor: Actor, sheetId: unknown, ordinal: unknown): Promise<RevisionDetail> {
  requireRead(actor);
  const { id, ord } = parseInput(z.object({ id: idField("Sheet"), ord: ordinalField("Revision") }), { id: sheetId, ord: ordinal });
  const rev = await findRevision(actor.organisationId, id, ord);
  if (!rev) throw notFound(`Revision not found`);
  return rev;
}

/** The comparison of two revisions of one sheet. */
export interface RevisionDiff {
  from: RevisionSummary;
  to: RevisionSummary;
  /** Changed input fields, by dotted path (old → new). */
  inputs: JsonChange[];
  /**
   * Changed result quantities: paths under `results.` (the calculation's results),
   * `intermediates.<id>.value`, `checks.<id>.{value,limit,pass,margin}` and
   * `warnings.<code>`. A side without results (invalid draft) counts as empty.
   */
  results: JsonChange[];
}

/** The parts of a stored result worth comparing, keyed so that paths are stable. */
export function comparableResults(results: Record<string, unknown> | null): Record<string, unknown> {
  if (!results) return {};
  const byKey = (list: unknown, key: string) =>
    Array.isArray(list)
      ? Object.fromEntries(
          list.filter((x): x is Record<string, unknown> => typeof x === "object" && x !== null).map((x, i) => [String(x[key] ?? i), x]),
        )
      : {};
  const checks = byKey(results.checks, "id");
  const warnings = byKey(results.warnings, "code");
  return {
    results: results.results ?? null,
    intermediates: results.intermediates ?? {},
    checks: Object.fromEntries(
      Object.entries(checks).map(([k, c]) => [k, { value: c.value, limit: c.limit, unit: c.unit, pass: c.pass, margin: c.margin }]),
    ),
    warnings: Object.fromEntries(Object.entries(warnings).map(([k, w]) => [k, w.message])),
  };
}

/**
 * Compares two revisions of a sheet: changed inputs and changed results.
 * Errors: 400 bad ids/ordinals; 404 sheet or either revision not found.
 */
export async function diffRevisions(actor: Actor, sheetId: unknown, fromOrdinal: unknown, toOrdinal: unknown): Promise<RevisionDiff> {
  requireRead(actor);
  const q = parseInput(diffRevisionsSchema, { sheetId, fromOrdinal, toOrdinal });
  const [a, b] = await Promise.all([findRevision(actor.organisationId, q.sheetId, q.fromOrdinal), findRevision(actor.organisationId, q.sheetId, q.toOrdinal)]);
  if (!a || !b) throw notFound(`Revision not found`);
  const summary = ({ inputs: _i, results: _r, sheetId: _s, ...rest }: RevisionDetail): RevisionSummary => rest;
  return {
    from: summary(a),
    to: summary(b),
    inputs: diffJson(a.inputs, b.inputs),
    results: diffJson(comparableResults(a.results), comparableResults(b.results)),
  };
}

/** One entry of a sheet's history. */
export interface SheetHistoryEntry {
  id: number;
  event: AuditEvent;
  /** The workflow transition recorded with the event (submit, withdraw, approve, return), or null. */
  transition: string | null;
  actorName: string | null;
  /** Label of the revision the event is about. */
  label: string | null;
  /** The review comment given with the event, if any. */
  comment: string | null;
  details: Record<string, unknown>;
  createdAt: Date;
}

/** The sheet's history from its audit trail, oldest first, review comments included. Errors: 400 bad id; 404 not found. */
export async function sheetHistory(actor: Actor, sheetId: unknown): Promise<SheetHistoryEntry[]> {
  requireRead(actor);
  const id = parseInput(idField("Sheet"), sheetId);
  const sheet = await findSheet(db(), actor.organisationId, id);
  if (!sheet) throw notFound(SHEET_NOT_FOUND);
  const rows = await listSheetAudit(actor.organisationId, sheet.id);
  const str = (v: unknown) => (typeof v === "string" ? v : null);
  return rows.map((r) => ({
    id: r.id,
    event: r.event,
    transition: str(r.details.transition),
    actorName: r.actorName,
    label: str(r.details.label),
    comment: str(r.details.comment),
    details: r.details,
    createdAt: r.createdAt,
  }));
}
