import "server-only";
import { and, desc, eq, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { ampacityTables, cableSchedules, projects, uploads, users } from "@/db/schema";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { notFound } from "@/lib/errors";
import type { ScheduleError, ScheduleRowResult } from "@/lib/schedules/types";
import { insertUpload } from "./uploads";

/**
 * Cable schedules of a project: the uploaded file (kept byte for byte in `uploads`) with
 * its hash beside the per-row results and the row errors. Every query is scoped to the
 * organisation; another organisation's schedule or project is not found.
 */

export const SCHEDULE_NOT_FOUND = "Cable schedule not found";

export interface NewSchedule {
  projectId: number;
  filename: string;
  contentType: string;
  data: Buffer;
  ampacityTableId: number | null;
  options: Record<string, unknown>;
  rowCount: number;
  validCount: number;
  failCount: number;
  results: ScheduleRowResult[];
  errors: ScheduleError[];
  engineVersion: string;
  resultsHash: string;
}

/** Stores the file, the schedule and its schedule.uploaded event in one transaction. */
export async function insertSchedule(actor: Actor, s: NewSchedule): Promise<{ id: number; uploadId: number; sha256: string }> {
  return db().transaction(async (tx) => {
    const [project] = await tx
      .select({ id: projects.id })
      .from(projects)
      .where(and(eq(projects.id, s.projectId), eq(projects.organisationId, actor.organisationId)))
      .limit(1);
    if (!project) throw notFound("Project not found");
    const up = await insertUpload(tx, actor, { kind: "cable-schedule", filename: s.filename, contentType: s.contentType, data: s.data });
    const [row] = await tx
      .insert(cableSchedules)
      .values({
        organisationId: actor.organisationId,
        projectId: s.projectId,
        uploadId: up.id,
        filename: s.filename,
        fileSha256: up.sha256,
        ampacityTableId: s.ampacityTableId,
        options: s.options,
        rowCount: s.rowCount,
        validCount: s.validCount,
        failCount: s.failCount,
        results: s.results as unknown as Record<string, unknown>[],
        errors: s.errors as unknown as Record<string, unknown>[],
        engineVersion: s.engineVersion,
        resultsHash: s.resultsHash,
        createdById: actor.id,
      })
      .$returningId();
    if (!row) throw new Error("insertSchedule: no id");
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "schedule.uploaded",
      entityType: "project",
      entityId: s.projectId,
      details: {
        scheduleId: row.id,
        uploadId: up.id,
        filename: s.filename,
        sha256: up.sha256,
        sizeBytes: s.data.length,
        rows: s.rowCount,
        valid: s.validCount,
        failing: s.failCount,
        errors: s.errors.length,
        ampacityTableId: s.ampacityTableId,
        resultsHash: s.resultsHash,
      },
    });
    return { id: row.id, uploadId: up.id, sha256: up.sha256 };
  });
}

/** A schedule without its rows: what lists and summaries show. */
export interface ScheduleSummary {
  id: number;
  projectId: number;
  uploadId: number;
  filename: string;
  fileSha256: string;
  sizeBytes: number;
  rowCount: number;
  validCount: number;
  failCount: number;
  errorCount: number;
  engineVersion: string;
  resultsHash: string;
  options: Record<string, unknown>;
  table: { id: number; name: string; version: number; source: string } | null;
  createdAt: Date;
  createdByName: string;
}

const summaryColumns = {
  id: cableSchedules.id,
  projectId: cableSchedules.projectId,
  uploadId: cableSchedules.uploadId,
  filename: cableSchedules.filename,
  fileSha256: cableSchedules.fileSha256,
  sizeBytes: uploads.sizeBytes,
  rowCount: cableSchedules.rowCount,
  validCount: cableSchedules.validCount,
  failCount: cableSchedules.failCount,
  errorCount: sql<number>`json_length(${cableSchedules.errors})`.mapWith(Number),
  engineVersion: cableSchedules.engineVersion,
  resultsHash: cableSchedules.resultsHash,
  options: cableSchedules.options,
  tableId: ampacityTables.id,
  tableName: ampacityTables.name,
  tableVersion: ampacityTables.version,
  tableSource: ampacityTables.source,
  createdAt: cableSchedules.createdAt,
  createdByName: users.name,
};

function toSummary(r: SummaryRow): ScheduleSummary {
  return {
    id: r.id,
    projectId: r.projectId,
    uploadId: r.uploadId,
    filename: r.filename,
    fileSha256: r.fileSha256,
    sizeBytes: r.sizeBytes ?? 0,
    rowCount: r.rowCount,
    validCount: r.validCount,
    failCount: r.failCount,
    errorCount: r.errorCount,
    engineVersion: r.engineVersion,
    resultsHash: r.resultsHash,
    options: r.options,
    table: r.tableId !== null && r.tableName !== null && r.tableVersion !== null ? { id: r.tableId, name: r.tableName, version: r.tableVersion, source: r.tableSource ?? "" } : null,
    createdAt: r.createdAt,
    createdByName: r.createdByName ?? "—",
  };
}

/** Summaries of the organisation's schedules matching `where` (always also scoped to the organisation), newest first. */
function summaries(organisationId: number, where: SQL | undefined, limit: number) {
  return db()
    .select(summaryColumns)
    .from(cableSchedules)
    .innerJoin(uploads, and(eq(uploads.id, cableSchedules.uploadId), eq(uploads.organisationId, cableSchedules.organisationId)))
    .leftJoin(ampacityTables, and(eq(ampacityTables.id, cableSchedules.ampacityTableId), eq(ampacityTables.organisationId, cableSchedules.organisationId)))
    .leftJoin(users, eq(users.id, cableSchedules.createdById))
    .where(and(eq(cableSchedules.organisationId, organisationId), where))
    .orderBy(desc(cableSchedules.createdAt), desc(cableSchedules.id))
    .limit(limit);
}

type SummaryRow = Awaited<ReturnType<typeof summaries>>[number];

/** The project's schedules, newest first, without their rows. */
export async function listSchedules(organisationId: number, projectId: number): Promise<ScheduleSummary[]> {
  const rows = await summaries(organisationId, eq(cableSchedules.projectId, projectId), 200);
  return rows.map((r) => toSummary(r));
}

export interface ScheduleDetail extends ScheduleSummary {
  results: ScheduleRowResult[];
  errors: ScheduleError[];
}

async function detail(organisationId: number, where: SQL | undefined): Promise<ScheduleDetail | null> {
  const [row] = await summaries(organisationId, where, 1);
  if (!row) return null;
  const [body] = await db().select({ results: cableSchedules.results, errors: cableSchedules.errors }).from(cableSchedules).where(and(eq(cableSchedules.id, row.id), eq(cableSchedules.organisationId, organisationId))).limit(1);
  const errors = (body?.errors ?? []) as unknown as ScheduleError[];
  return { ...toSummary(row), results: (body?.results ?? []) as unknown as ScheduleRowResult[], errors };
}

/** The project's current (newest) schedule with its rows, or null when none was uploaded. */
export async function currentSchedule(organisationId: number, projectId: number): Promise<ScheduleDetail | null> {
  return detail(organisationId, eq(cableSchedules.projectId, projectId));
}

/** One schedule of the project; another organisation's or another project's is not found. */
export async function getSchedule(organisationId: number, projectId: number, id: number): Promise<ScheduleDetail> {
  const d = await detail(organisationId, and(eq(cableSchedules.id, id), eq(cableSchedules.projectId, projectId)));
  if (!d) throw notFound(SCHEDULE_NOT_FOUND);
  return d;
}

/** The counts the project page shows, without the rows. */
export async function currentScheduleSummary(organisationId: number, projectId: number): Promise<ScheduleSummary | null> {
  const [row] = await summaries(organisationId, eq(cableSchedules.projectId, projectId), 1);
  return row ? toSummary(row) : null;
}

/** The file of one of the project's schedules, byte for byte as uploaded. */
export async function scheduleFile(organisationId: number, projectId: number, scheduleId: number): Promise<{ filename: string; contentType: string; sha256: string; data: Buffer }> {
  const [row] = await db()
    .select({ filename: uploads.filename, contentType: uploads.contentType, sha256: uploads.sha256, data: uploads.data })
    .from(cableSchedules)
    .innerJoin(uploads, and(eq(uploads.id, cableSchedules.uploadId), eq(uploads.organisationId, cableSchedules.organisationId), eq(uploads.kind, "cable-schedule")))
    .where(and(eq(cableSchedules.id, scheduleId), eq(cableSchedules.projectId, projectId), eq(cableSchedules.organisationId, organisationId)))
    .limit(1);
  if (!row) throw notFound(SCHEDULE_NOT_FOUND);
  return row;
}
