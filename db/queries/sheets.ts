import "server-only";
import { and, asc, desc, eq, ne, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/mysql-core";
import { db, type Db, type Tx } from "@/db/client";
import { auditEvents, organisations, projects, sheetRevisions, sheets, users, type AuditEvent, type RevisionScheme, type SheetStatus } from "@/db/schema";

/**
 * Data access for calculation sheets and their revisions. Every function takes the
 * organisation id and filters by it, so another organisation's row is simply absent.
 * The rules (who may do what) live in lib/sheets; these functions only read and write.
 */

/** The database or an open transaction. */
export type Executor = Db | Tx;

const checker = alias(users, "checker");

/** A project as the sheet functions need it. */
export interface SheetProject {
  id: number;
  code: string;
  name: string;
  archivedAt: Date | null;
}

/** The organisation's project, or null (absent or another organisation's). */
export async function findProject(ex: Executor, organisationId: number, projectId: number): Promise<SheetProject | null> {
  const [row] = await ex
    .select({ id: projects.id, code: projects.code, name: projects.name, archivedAt: projects.archivedAt })
    .from(projects)
    .where(and(eq(projects.id, projectId), eq(projects.organisationId, organisationId)))
    .limit(1);
  return row ?? null;
}

/** The organisation's revision label scheme. */
export async function revisionSchemeOf(ex: Executor, organisationId: number): Promise<RevisionScheme> {
  const [row] = await ex.select({ scheme: organisations.revisionScheme }).from(organisations).where(eq(organisations.id, organisationId)).limit(1);
  return row?.scheme ?? "letter";
}

/** Next free position for a sheet in a project (appended at the end). */
export async function nextSheetPosition(tx: Tx, organisationId: number, projectId: number): Promise<number> {
  const [row] = await tx
    .select({ max: sql<number | null>`max(${sheets.position})` })
    .from(sheets)
    .where(and(eq(sheets.projectId, projectId), eq(sheets.organisationId, organisationId)));
  return row?.max === null || row?.max === undefined ? 0 : Number(row.max) + 1;
}

/** Inserts a sheet (version 1) and returns its id. */
export async function insertSheet(
  tx: Tx,
  v: { organisationId: number; projectId: number; kind: string; tag: string; title: string; position: number; createdById: number },
): Promise<number> {
  const [row] = await tx.insert(sheets).values(v).$returningId();
  if (!row) throw new Error("insertSheet: no id returned");
  return row.id;
}

/** Values of a new revision. */
export interface NewRevision {
  organisationId: number;
  sheetId: number;
  ordinal: number;
  label: string;
  inputs: Record<string, unknown>;
  results: Record<string, unknown> | null;
  engineVersion: string;
  contentHash: string;
  authorId: number;
}

/** Inserts a draft revision and returns its id. */
export async function insertRevision(tx: Tx, v: NewRevision): Promise<number> {
  const [row] = await tx
    .insert(sheetRevisions)
    .values({ ...v, status: "draft" })
    .$returningId();
  if (!row) throw new Error("insertRevision: no id returned");
  return row.id;
}

/**
 * The optimistic lock: `UPDATE sheets SET version = version + 1 WHERE id AND version`.
 * Returns the new version, or null when no row matched (stale version or no such sheet).
 * The row stays locked until the transaction ends, so writers of one sheet take turns.
 */
export async function bumpSheetVersion(tx: Tx, organisationId: number, sheetId: number, expectedVersion: number): Promise<number | null> {
  const [res] = await tx
    .update(sheets)
    .set({ version: sql`${sheets.version} + 1` })
    .where(and(eq(sheets.id, sheetId), eq(sheets.organisationId, organisationId), eq(sheets.version, expectedVersion)));
  return res.affectedRows > 0 ? expectedVersion + 1 : null;
}

/** Sets a sheet's title (inside the transaction that bumped its version). */
export async function updateSheetTitle(tx: Tx, organisationId: number, sheetId: number, title: string): Promise<void> {
  await tx
    .update(sheets)
    .set({ title })
    .where(and(eq(sheets.id, sheetId), eq(sheets.organisationId, organisationId)));
}

/** A sheet's identity row. */
export interface SheetRow {
  id: number;
  organisationId: number;
  projectId: number;
  kind: string;
  tag: string;
  title: string;
  position: number;
  version: number;
  createdById: number;
  createdAt: Date;
  updatedAt: Date;
}

/** The organisation's sheet, or null. */
export async function findSheet(ex: Executor, organisationId: number, sheetId: number): Promise<SheetRow | null> {
  const [row] = await ex
    .select({
      id: sheets.id,
      organisationId: sheets.organisationId,
      projectId: sheets.projectId,
      kind: sheets.kind,
      tag: sheets.tag,
      title: sheets.title,
      position: sheets.position,
      version: sheets.version,
      createdById: sheets.createdById,
      createdAt: sheets.createdAt,
      updatedAt: sheets.updatedAt,
    })
    .from(sheets)
    .where(and(eq(sheets.id, sheetId), eq(sheets.organisationId, organisationId)))
    .limit(1);
  return row ?? null;
}

/** A full revision row (inputs and results included). */
export type RevisionRow = typeof sheetRevisions.$inferSelect;

/** The latest revision (highest ordinal) of a sheet, locked for update. */
export async function lockLatestRevision(tx: Tx, organisationId: number, sheetId: number): Promise<RevisionRow | null> {
  const [row] = await tx
    .select()
    .from(sheetRevisions)
    .where(and(eq(sheetRevisions.sheetId, sheetId), eq(sheetRevisions.organisationId, organisationId)))
    .orderBy(desc(sheetRevisions.ordinal))
    .limit(1)
    .for("update");
  return row ?? null;
}

/** Columns a status change or an edit may set on a revision. */
export type RevisionUpdate = Partial<
  Pick<
    RevisionRow,
    "status" | "inputs" | "results" | "engineVersion" | "contentHash" | "checkedById" | "submittedAt" | "decidedAt" | "reviewComment"
  >
>;

/** Updates one revision of the organisation. */
export async function updateRevision(tx: Tx, organisationId: number, revisionId: number, set: RevisionUpdate): Promise<void> {
  await tx
    .update(sheetRevisions)
    .set(set)
    .where(and(eq(sheetRevisions.id, revisionId), eq(sheetRevisions.organisationId, organisationId)));
}

/** Approved revisions of a sheet other than `exceptId`, locked (the ones a new approval supersedes). */
export async function lockOtherApprovedRevisions(tx: Tx, organisationId: number, sheetId: number, exceptId: number) {
  return tx
    .select({ id: sheetRevisions.id, ordinal: sheetRevisions.ordinal, label: sheetRevisions.label })
    .from(sheetRevisions)
    .where(
      and(
        eq(sheetRevisions.sheetId, sheetId),
        eq(sheetRevisions.organisationId, organisationId),
        eq(sheetRevisions.status, "approved"),
        ne(sheetRevisions.id, exceptId),
      ),
    )
    .orderBy(asc(sheetRevisions.ordinal))
    .for("update");
}

/** A user to notify. */
export interface Contact {
  id: number;
  name: string;
  email: string;
}

/** Active leads of the organisation (review requests go to them). */
export async function activeLeads(ex: Executor, organisationId: number): Promise<Contact[]> {
  return ex
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.organisationId, organisationId), eq(users.role, "lead"), eq(users.status, "active")))
    .orderBy(asc(users.id));
}

/** An active user of the organisation, or null (deactivated users get no mail). */
export async function activeContact(ex: Executor, organisationId: number, userId: number): Promise<Contact | null> {
  const [row] = await ex
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.id, userId), eq(users.organisationId, organisationId), eq(users.status, "active")))
    .limit(1);
  return row ?? null;
}

/* ------------------------------------------------------------------ */
/* Reads                                                                 */
/* ------------------------------------------------------------------ */

/** One revision without its content, with the people's names. */
export interface RevisionSummary {
  id: number;
  ordinal: number;
  label: string;
  status: SheetStatus;
  authorId: number;
  authorName: string;
  checkedById: number | null;
  checkedByName: string | null;
  submittedAt: Date | null;
  decidedAt: Date | null;
  reviewComment: string | null;
  engineVersion: string;
  contentHash: string;
  createdAt: Date;
  updatedAt: Date;
}

const summaryColumns = {
  id: sheetRevisions.id,
  ordinal: sheetRevisions.ordinal,
  label: sheetRevisions.label,
  status: sheetRevisions.status,
  authorId: sheetRevisions.authorId,
  authorName: users.name,
  checkedById: sheetRevisions.checkedById,
  checkedByName: checker.name,
  submittedAt: sheetRevisions.submittedAt,
  decidedAt: sheetRevisions.decidedAt,
  reviewComment: sheetRevisions.reviewComment,
  engineVersion: sheetRevisions.engineVersion,
  contentHash: sheetRevisions.contentHash,
  createdAt: sheetRevisions.createdAt,
  updatedAt: sheetRevisions.updatedAt,
};

/** Every revision of a sheet, oldest first. */
export async function listRevisions(organisationId: number, sheetId: number): Promise<RevisionSummary[]> {
  return db()
    .select(summaryColumns)
    .from(sheetRevisions)
    .innerJoin(users, eq(users.id, sheetRevisions.authorId))
    .leftJoin(checker, eq(checker.id, sheetRevisions.checkedById))
    .where(and(eq(sheetRevisions.sheetId, sheetId), eq(sheetRevisions.organisationId, organisationId)))
    .orderBy(asc(sheetRevisions.ordinal));
}

/** One revision with its content. */
export interface RevisionDetail extends RevisionSummary {
  sheetId: number;
  inputs: Record<string, unknown>;
  results: Record<string, unknown> | null;
}

/** A revision of the organisation's sheet by ordinal, or null. */
export async function findRevision(organisationId: number, sheetId: number, ordinal: number): Promise<RevisionDetail | null> {
  const [row] = await db()
    .select({ ...summaryColumns, sheetId: sheetRevisions.sheetId, inputs: sheetRevisions.inputs, results: sheetRevisions.results })
    .from(sheetRevisions)
    .innerJoin(users, eq(users.id, sheetRevisions.authorId))
    .leftJoin(checker, eq(checker.id, sheetRevisions.checkedById))
    .where(and(eq(sheetRevisions.sheetId, sheetId), eq(sheetRevisions.organisationId, organisationId), eq(sheetRevisions.ordinal, ordinal)))
    .limit(1);
  return row ?? null;
}

/** The latest revision's ordinal of the sheet in the outer query. */
const latestOrdinal = sql`(select max(r2.ordinal) from ${sheetRevisions} r2 where r2.sheet_id = ${sheets.id})`;
/** The label of the sheet's newest approved revision (null when none). */
const approvedLabel = sql<string | null>`(select r3.label from ${sheetRevisions} r3 where r3.sheet_id = ${sheets.id} and r3.status = 'approved' order by r3.ordinal desc limit 1)`;

/** One sheet in a list, described by its latest revision. */
export interface SheetListItem {
  id: number;
  projectId: number;
  kind: string;
  tag: string;
  title: string;
  position: number;
  version: number;
  revisionId: number;
  ordinal: number;
  label: string;
  status: SheetStatus;
  authorId: number;
  authorName: string;
  checkedByName: string | null;
  /** Label of the newest approved revision (the one in force), or null. */
  approvedLabel: string | null;
  submittedAt: Date | null;
  decidedAt: Date | null;
  updatedAt: Date;
}

const listColumns = {
  id: sheets.id,
  projectId: sheets.projectId,
  kind: sheets.kind,
  tag: sheets.tag,
  title: sheets.title,
  position: sheets.position,
  version: sheets.version,
  revisionId: sheetRevisions.id,
  ordinal: sheetRevisions.ordinal,
  label: sheetRevisions.label,
  status: sheetRevisions.status,
  authorId: sheetRevisions.authorId,
  authorName: users.name,
  checkedByName: checker.name,
  approvedLabel,
  submittedAt: sheetRevisions.submittedAt,
  decidedAt: sheetRevisions.decidedAt,
  updatedAt: sheets.updatedAt,
};

/** A sheet list row with its project. */
export interface SheetWithProject extends SheetListItem {
  projectCode: string;
  projectName: string;
}

function listQuery() {
  return db()
    .select({ ...listColumns, projectCode: projects.code, projectName: projects.name })
    .from(sheets)
    .innerJoin(projects, eq(projects.id, sheets.projectId))
    .innerJoin(sheetRevisions, and(eq(sheetRevisions.sheetId, sheets.id), eq(sheetRevisions.ordinal, latestOrdinal)))
    .innerJoin(users, eq(users.id, sheetRevisions.authorId))
    .leftJoin(checker, eq(checker.id, sheetRevisions.checkedById));
}

const LIST_LIMIT = 500;

/** The project's sheets in their order. */
export async function listSheetsOfProject(organisationId: number, projectId: number): Promise<SheetWithProject[]> {
  return listQuery()
    .where(and(eq(sheets.organisationId, organisationId), eq(sheets.projectId, projectId)))
    .orderBy(asc(sheets.position), asc(sheets.id))
    .limit(LIST_LIMIT);
}

/** Sheets whose latest revision is in review, except those authored by `excludeAuthorId`; oldest submission first. */
export async function listInReview(organisationId: number, excludeAuthorId: number): Promise<SheetWithProject[]> {
  return listQuery()
    .where(and(eq(sheets.organisationId, organisationId), eq(sheetRevisions.status, "in_review"), ne(sheetRevisions.authorId, excludeAuthorId)))
    .orderBy(asc(sheetRevisions.submittedAt), asc(sheets.id))
    .limit(LIST_LIMIT);
}

/** Sheets whose latest revision the user authored; recently changed first. */
export async function listAuthoredBy(organisationId: number, userId: number): Promise<SheetWithProject[]> {
  return listQuery()
    .where(and(eq(sheets.organisationId, organisationId), eq(sheetRevisions.authorId, userId)))
    .orderBy(desc(sheets.updatedAt), desc(sheets.id))
    .limit(LIST_LIMIT);
}

/** One audit event of a sheet, with the actor's name. */
export interface SheetAuditEntry {
  id: number;
  event: AuditEvent;
  actorId: number | null;
  actorName: string | null;
  details: Record<string, unknown>;
  createdAt: Date;
}

/** The sheet's audit trail, oldest first. */
export async function listSheetAudit(organisationId: number, sheetId: number): Promise<SheetAuditEntry[]> {
  return db()
    .select({
      id: auditEvents.id,
      event: auditEvents.event,
      actorId: auditEvents.actorId,
      actorName: users.name,
      details: auditEvents.details,
      createdAt: auditEvents.createdAt,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(eq(auditEvents.organisationId, organisationId), eq(auditEvents.entityType, "sheet"), eq(auditEvents.entityId, sheetId)))
    .orderBy(asc(auditEvents.createdAt), asc(auditEvents.id));
}
