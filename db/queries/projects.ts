import "server-only";
import { and, asc, desc, eq, isNull, like, or, type SQL } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { auditEvents, projects, users, type AuditEvent } from "@/db/schema";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { can, type Permission } from "@/lib/auth/roles";
import { conflict, forbidden, isDuplicateKey, notFound, validationError } from "@/lib/errors";
import {
  toProjectRecord,
  type ProjectInput,
  type ProjectListQuery,
  type ProjectRecordValues,
  type ProjectUpdateInput,
  STALE_PROJECT_MESSAGE,
} from "@/lib/validation/project";

/** One row of the project list, as the JSON API sends it (dates as ISO strings). */
export interface ProjectListItem {
  id: number;
  code: string;
  name: string;
  client: string;
  site: string;
  systemVoltage: number;
  systemType: ProjectRecordValues["systemType"];
  frequency: number;
  standardFamily: ProjectRecordValues["standardFamily"];
  unitSystem: ProjectRecordValues["unitSystem"];
  archivedAt: string | null;
  updatedAt: string;
}

export interface ProjectDetail extends ProjectRecordValues {
  id: number;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  createdByName: string;
}

export interface ProjectAuditEntry {
  id: number;
  event: AuditEvent;
  actorName: string | null;
  details: Record<string, unknown>;
  createdAt: Date;
}

const NOT_FOUND_MESSAGE = "Project not found";
const LIST_LIMIT = 500;

function requirePermission(actor: Actor, permission: Permission) {
  if (!can(actor.role, permission)) throw forbidden();
}

/** Escapes LIKE wildcards so a search for "MCC_2" matches the underscore literally. */
function likeTerm(q: string) {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

const SORT_COLUMNS = {
  code: projects.code,
  name: projects.name,
  client: projects.client,
  updated: projects.updatedAt,
} as const;

export async function listProjects(organisationId: number, query: ProjectListQuery): Promise<ProjectListItem[]> {
  const where: SQL[] = [eq(projects.organisationId, organisationId)];
  if (!query.archived) where.push(isNull(projects.archivedAt));
  if (query.q) {
    const term = likeTerm(query.q);
    where.push(or(like(projects.code, term), like(projects.name, term), like(projects.client, term), like(projects.site, term))!);
  }
  const order = query.dir === "asc" ? asc : desc;
  const rows = await db()
    .select({
      id: projects.id,
      code: projects.code,
      name: projects.name,
      client: projects.client,
      site: projects.site,
      systemVoltage: projects.systemVoltage,
      systemType: projects.systemType,
      frequency: projects.frequency,
      standardFamily: projects.standardFamily,
      unitSystem: projects.unitSystem,
      archivedAt: projects.archivedAt,
      updatedAt: projects.updatedAt,
    })
    .from(projects)
    .where(and(...where))
    .orderBy(order(SORT_COLUMNS[query.sort]), order(projects.id))
    .limit(LIST_LIMIT);
  return rows.map((r) => ({ ...r, archivedAt: r.archivedAt ? r.archivedAt.toISOString() : null, updatedAt: r.updatedAt.toISOString() }));
}

/** A project of the organisation; another organisation's project is not found. */
export async function getProject(organisationId: number, id: number): Promise<ProjectDetail> {
  const [row] = await db()
    .select({
      id: projects.id,
      code: projects.code,
      name: projects.name,
      client: projects.client,
      site: projects.site,
      systemVoltage: projects.systemVoltage,
      systemType: projects.systemType,
      frequency: projects.frequency,
      earthing: projects.earthing,
      designAmbientC: projects.designAmbient,
      altitudeM: projects.altitude,
      standardFamily: projects.standardFamily,
      unitSystem: projects.unitSystem,
      notes: projects.notes,
      version: projects.version,
      archivedAt: projects.archivedAt,
      createdAt: projects.createdAt,
      updatedAt: projects.updatedAt,
      createdByName: users.name,
    })
    .from(projects)
    .innerJoin(users, eq(users.id, projects.createdById))
    .where(and(eq(projects.id, id), eq(projects.organisationId, organisationId)))
    .limit(1);
  if (!row) throw notFound(NOT_FOUND_MESSAGE);
  return row;
}

/** The latest audit events of one project, newest first. */
export async function listProjectAudit(organisationId: number, projectId: number, limit = 20): Promise<ProjectAuditEntry[]> {
  return db()
    .select({
      id: auditEvents.id,
      event: auditEvents.event,
      actorName: users.name,
      details: auditEvents.details,
      createdAt: auditEvents.createdAt,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(eq(auditEvents.organisationId, organisationId), eq(auditEvents.entityType, "project"), eq(auditEvents.entityId, projectId)))
    .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id))
    .limit(limit);
}

function columnValues(r: ProjectRecordValues) {
  return {
    code: r.code,
    name: r.name,
    client: r.client,
    site: r.site,
    systemVoltage: r.systemVoltage,
    systemType: r.systemType,
    frequency: r.frequency,
    earthing: r.earthing,
    designAmbient: r.designAmbientC,
    altitude: r.altitudeM,
    standardFamily: r.standardFamily,
    unitSystem: r.unitSystem,
    notes: r.notes,
  };
}

function duplicateCode(code: string) {
  return validationError({ code: `Project code ${code} is already used in your organisation` }, "Project code is already used");
}

export async function createProject(actor: Actor, input: ProjectInput): Promise<{ id: number }> {
  requirePermission(actor, "project.write");
  const record = toProjectRecord(input);
  try {
    return await db().transaction(async (tx) => {
      const [created] = await tx
        .insert(projects)
        .values({ ...columnValues(record), organisationId: actor.organisationId, createdById: actor.id })
        .$returningId();
      const id = created!.id;
      await audit(tx, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        event: "project.created",
        entityType: "project",
        entityId: id,
        details: { code: record.code, name: record.name },
      });
      return { id };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateCode(record.code);
    throw err;
  }
}

/** Locks the organisation's project row for the rest of the transaction. */
async function lockProject(tx: Tx, organisationId: number, id: number) {
  const [row] = await tx
    .select()
    .from(projects)
    .where(and(eq(projects.id, id), eq(projects.organisationId, organisationId)))
    .for("update")
    .limit(1);
  if (!row) throw notFound(NOT_FOUND_MESSAGE);
  return row;
}

/**
 * Saves an edit made against `input.version`. A newer version in the database means
 * someone else saved since: 409, and nothing is overwritten.
 */
export async function updateProject(actor: Actor, input: ProjectUpdateInput): Promise<{ id: number; version: number }> {
  requirePermission(actor, "project.write");
  const record = toProjectRecord(input);
  const values = columnValues(record);
  try {
    return await db().transaction(async (tx) => {
      const current = await lockProject(tx, actor.organisationId, input.id);
      if (current.version !== input.version) throw conflict(STALE_PROJECT_MESSAGE);
      if (current.archivedAt) throw conflict("This project is archived; restore it before editing");
      const changed = (Object.keys(values) as (keyof typeof values)[]).filter((k) => current[k] !== values[k]);
      // Saving an unchanged form is not an edit: no new version, no audit noise.
      if (changed.length === 0) return { id: input.id, version: current.version };
      const version = current.version + 1;
      await tx
        .update(projects)
        .set({ ...values, version })
        .where(and(eq(projects.id, input.id), eq(projects.organisationId, actor.organisationId), eq(projects.version, input.version)));
      await audit(tx, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        event: "project.updated",
        entityType: "project",
        entityId: input.id,
        details: { code: record.code, changed },
      });
      return { id: input.id, version };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateCode(record.code);
    throw err;
  }
}

/** Archives or restores a project; asking for the state it is already in changes nothing. */
export async function setProjectArchived(actor: Actor, id: number, archived: boolean): Promise<{ id: number; version: number; archived: boolean }> {
  requirePermission(actor, "project.archive");
  return db().transaction(async (tx) => {
    const current = await lockProject(tx, actor.organisationId, id);
    if (Boolean(current.archivedAt) === archived) return { id, version: current.version, archived };
    const version = current.version + 1;
    await tx
      .update(projects)
      .set({ archivedAt: archived ? new Date() : null, version })
      .where(and(eq(projects.id, id), eq(projects.organisationId, actor.organisationId)));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: archived ? "project.archived" : "project.restored",
      entityType: "project",
      entityId: id,
      details: { code: current.code },
    });
    return { id, version, archived };
  });
}
