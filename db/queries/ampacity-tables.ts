import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { ampacityTables, organisations, uploads, users } from "@/db/schema";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import type { AmpacityRow } from "@/lib/engine/ampacity-table";
import { conflict, forbidden, isDuplicateKey, notFound } from "@/lib/errors";
import { insertUpload } from "./uploads";

/** An organisation's ampacity tables, one row per version. Every query is scoped to the organisation. */

const NOT_FOUND_MESSAGE = "Ampacity table not found";

export interface AmpacityTableListItem {
  id: number;
  name: string;
  version: number;
  source: string;
  rowCount: number;
  active: boolean;
  createdAt: Date;
  createdByName: string | null;
  retiredAt: Date | null;
}

/** The organisation's tables, names A→Z, newest version first within a name. */
export async function listAmpacityTables(organisationId: number, opts: { activeOnly?: boolean } = {}): Promise<AmpacityTableListItem[]> {
  const where = [eq(ampacityTables.organisationId, organisationId)];
  if (opts.activeOnly) where.push(eq(ampacityTables.active, true));
  return db()
    .select({
      id: ampacityTables.id,
      name: ampacityTables.name,
      version: ampacityTables.version,
      source: ampacityTables.source,
      rowCount: ampacityTables.rowCount,
      active: ampacityTables.active,
      createdAt: ampacityTables.createdAt,
      createdByName: users.name,
      retiredAt: ampacityTables.retiredAt,
    })
    .from(ampacityTables)
    .leftJoin(users, eq(users.id, ampacityTables.createdById))
    .where(and(...where))
    .orderBy(asc(ampacityTables.name), desc(ampacityTables.version))
    .limit(1000);
}

/** One version with its rows (SI), or null when it does not exist in this organisation. */
export async function getAmpacityTable(
  organisationId: number,
  id: number,
): Promise<{ id: number; name: string; version: number; source: string; rows: AmpacityRow[]; active: boolean } | null> {
  const [row] = await db()
    .select({ id: ampacityTables.id, name: ampacityTables.name, version: ampacityTables.version, source: ampacityTables.source, rows: ampacityTables.rows, active: ampacityTables.active })
    .from(ampacityTables)
    .where(and(eq(ampacityTables.id, id), eq(ampacityTables.organisationId, organisationId)))
    .limit(1);
  if (!row) return null;
  return { ...row, rows: row.rows as unknown as AmpacityRow[] };
}

export interface AmpacityTableDetail {
  id: number;
  name: string;
  version: number;
  source: string;
  rows: AmpacityRow[];
  rowCount: number;
  active: boolean;
  retiredAt: Date | null;
  createdAt: Date;
  createdByName: string | null;
  fileSha256: string;
  uploadId: number;
  filename: string;
  sizeBytes: number;
  /** Every version of the same name, newest first (for links between versions). */
  versions: { id: number; version: number; active: boolean; createdAt: Date }[];
}

/** One version with its file details and its siblings; another organisation's is a 404. */
export async function findAmpacityTableDetail(organisationId: number, id: number): Promise<AmpacityTableDetail> {
  const [row] = await db()
    .select({
      id: ampacityTables.id,
      name: ampacityTables.name,
      version: ampacityTables.version,
      source: ampacityTables.source,
      rows: ampacityTables.rows,
      rowCount: ampacityTables.rowCount,
      active: ampacityTables.active,
      retiredAt: ampacityTables.retiredAt,
      createdAt: ampacityTables.createdAt,
      createdByName: users.name,
      fileSha256: ampacityTables.fileSha256,
      uploadId: ampacityTables.uploadId,
      filename: uploads.filename,
      sizeBytes: uploads.sizeBytes,
    })
    .from(ampacityTables)
    .innerJoin(uploads, and(eq(uploads.id, ampacityTables.uploadId), eq(uploads.organisationId, ampacityTables.organisationId)))
    .leftJoin(users, eq(users.id, ampacityTables.createdById))
    .where(and(eq(ampacityTables.id, id), eq(ampacityTables.organisationId, organisationId)))
    .limit(1);
  if (!row) throw notFound(NOT_FOUND_MESSAGE);
  const versions = await db()
    .select({ id: ampacityTables.id, version: ampacityTables.version, active: ampacityTables.active, createdAt: ampacityTables.createdAt })
    .from(ampacityTables)
    .where(and(eq(ampacityTables.organisationId, organisationId), eq(ampacityTables.name, row.name)))
    .orderBy(desc(ampacityTables.version));
  return { ...row, rows: row.rows as unknown as AmpacityRow[], versions };
}

/** The latest version number under a name (case as the database compares it), or 0. */
export async function latestAmpacityVersion(organisationId: number, name: string): Promise<number> {
  const [r] = await db()
    .select({ v: sql<number | null>`max(${ampacityTables.version})` })
    .from(ampacityTables)
    .where(and(eq(ampacityTables.organisationId, organisationId), eq(ampacityTables.name, name.trim())));
  return Number(r?.v ?? 0);
}

export interface NewAmpacityTable {
  name: string;
  source: string;
  rows: AmpacityRow[];
  file: { filename: string; contentType: string; data: Buffer };
}

const MAX_ATTEMPTS = 5;

function isDeadlock(err: unknown): boolean {
  let e: unknown = err;
  for (let i = 0; i < 5 && e && typeof e === "object"; i++) {
    if ((e as { errno?: number }).errno === 1213 || (e as { code?: string }).code === "ER_LOCK_DEADLOCK") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/**
 * Stores the file, the next version of the named table (max + 1 for that name) and the
 * audit event in one transaction. Two uploads under the same name at once are serialised
 * by a lock on the organisation row; the unique (organisation, name, version) index and a
 * retry cover anything that slips past.
 */
export async function createAmpacityTableVersion(actor: Actor, t: NewAmpacityTable): Promise<{ id: number; name: string; version: number; sha256: string }> {
  if (!can(actor.role, "ampacity.manage")) throw forbidden();
  const name = t.name.trim();
  for (let attempt = 1; ; attempt++) {
    try {
      return await db().transaction(async (tx) => {
        await tx.select({ id: organisations.id }).from(organisations).where(eq(organisations.id, actor.organisationId)).for("update");
        const [latest] = await tx
          .select({ name: ampacityTables.name, version: ampacityTables.version })
          .from(ampacityTables)
          .where(and(eq(ampacityTables.organisationId, actor.organisationId), eq(ampacityTables.name, name)))
          .orderBy(desc(ampacityTables.version))
          .limit(1);
        // Keep the spelling of the first upload when the database matched the name case-insensitively.
        const storedName = latest?.name ?? name;
        const version = (latest?.version ?? 0) + 1;
        const up = await insertUpload(tx, actor, { kind: "ampacity-table", filename: t.file.filename, contentType: t.file.contentType, data: t.file.data });
        const [ins] = await tx
          .insert(ampacityTables)
          .values({
            organisationId: actor.organisationId,
            name: storedName,
            version,
            source: t.source,
            rows: t.rows as unknown as Record<string, unknown>[],
            rowCount: t.rows.length,
            uploadId: up.id,
            fileSha256: up.sha256,
            active: true,
            createdById: actor.id,
          })
          .$returningId();
        if (!ins) throw new Error("createAmpacityTableVersion: no id");
        await audit(tx, {
          organisationId: actor.organisationId,
          actorId: actor.id,
          event: "ampacity_table.uploaded",
          entityType: "ampacity_table",
          entityId: ins.id,
          details: { name: storedName, version, rowCount: t.rows.length, uploadId: up.id, sha256: up.sha256, filename: t.file.filename, sizeBytes: t.file.data.length },
        });
        return { id: ins.id, name: storedName, version, sha256: up.sha256 };
      });
    } catch (err) {
      if ((isDuplicateKey(err) || isDeadlock(err)) && attempt < MAX_ATTEMPTS) continue;
      if (isDuplicateKey(err)) throw conflict("Another upload under this name was stored at the same moment; upload again to add the next version");
      throw err;
    }
  }
}

/** Retires (active = false) or restores one version, with its audit event; a no-op change is refused. */
export async function setAmpacityTableActive(actor: Actor, id: number, active: boolean): Promise<{ id: number; name: string; version: number; active: boolean }> {
  if (!can(actor.role, "ampacity.manage")) throw forbidden();
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({ id: ampacityTables.id, name: ampacityTables.name, version: ampacityTables.version, active: ampacityTables.active })
      .from(ampacityTables)
      .where(and(eq(ampacityTables.id, id), eq(ampacityTables.organisationId, actor.organisationId)))
      .for("update");
    if (!row) throw notFound(NOT_FOUND_MESSAGE);
    if (row.active === active) throw conflict(active ? `${row.name} v${row.version} is already active` : `${row.name} v${row.version} is already retired`);
    await tx
      .update(ampacityTables)
      .set({ active, retiredAt: active ? null : new Date() })
      .where(and(eq(ampacityTables.id, id), eq(ampacityTables.organisationId, actor.organisationId)));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: active ? "ampacity_table.restored" : "ampacity_table.retired",
      entityType: "ampacity_table",
      entityId: id,
      details: { name: row.name, version: row.version },
    });
    return { id, name: row.name, version: row.version, active };
  });
}
