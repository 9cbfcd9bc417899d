import "server-only";
import { createHash } from "node:crypto";
import { and, desc, eq, inArray } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { auditEvents, organisations, uploads, users, type UploadKind } from "@/db/schema";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { notFound } from "@/lib/errors";

/** Files kept byte for byte (logos, issued packages). Every query is scoped to the organisation. */

export const sha256Hex = (data: Buffer) => createHash("sha256").update(data).digest("hex");

export interface NewUpload {
  kind: UploadKind;
  filename: string;
  contentType: string;
  data: Buffer;
}

export async function insertUpload(tx: Tx, actor: Actor, f: NewUpload): Promise<{ id: number; sha256: string }> {
  const sha256 = sha256Hex(f.data);
  const [row] = await tx
    .insert(uploads)
    .values({ organisationId: actor.organisationId, kind: f.kind, filename: f.filename, contentType: f.contentType, sizeBytes: f.data.length, sha256, data: f.data, createdById: actor.id })
    .$returningId();
  if (!row) throw new Error("insertUpload: no id");
  return { id: row.id, sha256 };
}

export interface StoredFile {
  id: number;
  kind: UploadKind;
  filename: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  data: Buffer;
  createdAt: Date;
}

/** One file of the organisation of the given kind; another organisation's is not found. */
export async function findUpload(organisationId: number, id: number, kind: UploadKind): Promise<StoredFile> {
  const [row] = await db()
    .select({
      id: uploads.id,
      kind: uploads.kind,
      filename: uploads.filename,
      contentType: uploads.contentType,
      sizeBytes: uploads.sizeBytes,
      sha256: uploads.sha256,
      data: uploads.data,
      createdAt: uploads.createdAt,
    })
    .from(uploads)
    .where(and(eq(uploads.id, id), eq(uploads.organisationId, organisationId), eq(uploads.kind, kind)))
    .limit(1);
  if (!row) throw notFound("File not found");
  return row;
}

/** The organisation's name and logo (bytes and type), as a PDF's title block needs them. */
export async function organisationBranding(organisationId: number): Promise<{ name: string; logo: { data: Buffer; contentType: string } | null }> {
  const [org] = await db().select({ name: organisations.name, logoUploadId: organisations.logoUploadId }).from(organisations).where(eq(organisations.id, organisationId)).limit(1);
  if (!org) throw notFound("Organisation not found");
  if (!org.logoUploadId) return { name: org.name, logo: null };
  const [logo] = await db()
    .select({ data: uploads.data, contentType: uploads.contentType })
    .from(uploads)
    .where(and(eq(uploads.id, org.logoUploadId), eq(uploads.organisationId, organisationId), eq(uploads.kind, "logo")))
    .limit(1);
  return { name: org.name, logo: logo ?? null };
}

/** Stores a new logo and points the organisation at it, with its audit event, in one transaction. */
export async function setOrganisationLogo(actor: Actor, f: { filename: string; contentType: string; data: Buffer; width: number; height: number }): Promise<{ uploadId: number }> {
  return db().transaction(async (tx) => {
    const up = await insertUpload(tx, actor, { kind: "logo", filename: f.filename, contentType: f.contentType, data: f.data });
    await tx.update(organisations).set({ logoUploadId: up.id }).where(eq(organisations.id, actor.organisationId));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "organisation.logo_uploaded",
      entityType: "organisation",
      entityId: actor.organisationId,
      details: { uploadId: up.id, filename: f.filename, contentType: f.contentType, sizeBytes: f.data.length, sha256: up.sha256, width: f.width, height: f.height },
    });
    return { uploadId: up.id };
  });
}

/** The organisation's current logo's file details (no bytes), or null. */
export async function currentLogo(organisationId: number): Promise<{ id: number; filename: string; contentType: string; sizeBytes: number; createdAt: Date } | null> {
  const [row] = await db()
    .select({ id: uploads.id, filename: uploads.filename, contentType: uploads.contentType, sizeBytes: uploads.sizeBytes, createdAt: uploads.createdAt })
    .from(organisations)
    .innerJoin(uploads, and(eq(uploads.id, organisations.logoUploadId), eq(uploads.organisationId, organisations.id)))
    .where(eq(organisations.id, organisationId))
    .limit(1);
  return row ?? null;
}

export interface IssuedPackage {
  uploadId: number;
  filename: string;
  sizeBytes: number;
  sha256: string;
  label: string;
  sheetCount: number;
  includesDrafts: boolean;
  issuedAt: Date;
  issuedByName: string | null;
}

/**
 * Stores an issued package and records package.issued against the project in one
 * transaction. The audit event is what ties the file to its project (uploads carry no
 * project column).
 */
export async function storePackage(
  actor: Actor,
  projectId: number,
  f: {
    filename: string;
    data: Buffer;
    label: string;
    sheetCount: number;
    includesDrafts: boolean;
    sheets: string[];
    /** The cable schedule printed in the package, if the project has one. */
    schedule?: { id: number; filename: string; fileSha256: string; resultsHash: string } | null;
  },
): Promise<{ uploadId: number; sha256: string }> {
  return db().transaction(async (tx) => {
    const up = await insertUpload(tx, actor, { kind: "package", filename: f.filename, contentType: "application/pdf", data: f.data });
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "package.issued",
      entityType: "project",
      entityId: projectId,
      details: {
        uploadId: up.id,
        sha256: up.sha256,
        label: f.label,
        sheetCount: f.sheetCount,
        includesDrafts: f.includesDrafts,
        sheets: f.sheets,
        schedule: f.schedule ?? null,
        sizeBytes: f.data.length,
      },
    });
    return { uploadId: up.id, sha256: up.sha256 };
  });
}

/** The project's issued packages, newest first. */
export async function listProjectPackages(organisationId: number, projectId: number): Promise<IssuedPackage[]> {
  const events = await db()
    .select({ details: auditEvents.details, createdAt: auditEvents.createdAt, actorName: users.name })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(eq(auditEvents.organisationId, organisationId), eq(auditEvents.event, "package.issued"), eq(auditEvents.entityType, "project"), eq(auditEvents.entityId, projectId)))
    .orderBy(desc(auditEvents.id))
    .limit(200);
  const ids = events.map((e) => Number(e.details.uploadId)).filter((n) => Number.isInteger(n) && n > 0);
  if (ids.length === 0) return [];
  const files = await db()
    .select({ id: uploads.id, filename: uploads.filename, sizeBytes: uploads.sizeBytes, sha256: uploads.sha256 })
    .from(uploads)
    .where(and(eq(uploads.organisationId, organisationId), eq(uploads.kind, "package"), inArray(uploads.id, ids)));
  const byId = new Map(files.map((f) => [f.id, f]));
  return events.flatMap((e) => {
    const f = byId.get(Number(e.details.uploadId));
    if (!f) return [];
    return [
      {
        uploadId: f.id,
        filename: f.filename,
        sizeBytes: f.sizeBytes,
        sha256: f.sha256,
        label: String(e.details.label ?? ""),
        sheetCount: Number(e.details.sheetCount ?? 0),
        includesDrafts: e.details.includesDrafts === true,
        issuedAt: e.createdAt,
        issuedByName: e.actorName,
      },
    ];
  });
}

/** Whether an upload of kind "package" belongs to this project (its package.issued event names both). */
export async function packageBelongsToProject(organisationId: number, projectId: number, uploadId: number): Promise<boolean> {
  return (await listProjectPackages(organisationId, projectId)).some((p) => p.uploadId === uploadId);
}
