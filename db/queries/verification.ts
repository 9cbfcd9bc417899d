import "server-only";
import { and, desc, eq, gt, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, sheetRevisions, sheets } from "@/db/schema";
import { codeDigestPrefix, normaliseCode, verificationCode } from "@/lib/pdf/verification-code";

/**
 * The public check behind an approval stamp. This is the one query that is not
 * scoped to an organisation: the code itself is the key, and the answer names only the
 * organisation, the sheet tag and revision labels — no project, inputs or results.
 *
 * Codes are not stored. The database hashes each stamped revision (approved, or
 * approved and later superseded) the way the code was made and keeps those whose digest
 * starts with the code's first 48 bits, so only a match (if any) comes back to be
 * checked in full here. That is still a scan, done inside the database; an indexed
 * lookup needs the digest prefix stored (a generated, indexed column).
 */
export type VerificationState = "approved-current" | "superseded" | "unknown";

export interface Verification {
  state: VerificationState;
  organisationName?: string;
  sheetTag?: string;
  label?: string;
  approvedAt?: Date | null;
  /** For a superseded revision: the revision in force now (or the next approved one) and when it was approved. */
  supersededBy?: { label: string; approvedAt: Date | null } | null;
}

export async function lookupVerification(rawCode: string): Promise<Verification> {
  const code = normaliseCode(rawCode);
  if (!code) return { state: "unknown" };
  // The same text as verificationCode hashes: "<content hash>:<sheet id>:<ordinal>".
  const digest = sql`sha2(concat(${sheetRevisions.contentHash}, ':', ${sheetRevisions.sheetId}, ':', ${sheetRevisions.ordinal}), 256)`;
  const candidates = await db()
    .select({ id: sheetRevisions.id, sheetId: sheetRevisions.sheetId, ordinal: sheetRevisions.ordinal, contentHash: sheetRevisions.contentHash })
    .from(sheetRevisions)
    .where(and(inArray(sheetRevisions.status, ["approved", "superseded"]), sql`left(${digest}, 12) = ${codeDigestPrefix(code)}`));
  const hit = candidates.find((r) => verificationCode(r.contentHash, r.sheetId, r.ordinal) === code);
  if (!hit) return { state: "unknown" };

  const [row] = await db()
    .select({ status: sheetRevisions.status, label: sheetRevisions.label, decidedAt: sheetRevisions.decidedAt, tag: sheets.tag, organisationName: organisations.name })
    .from(sheetRevisions)
    .innerJoin(sheets, eq(sheets.id, sheetRevisions.sheetId))
    .innerJoin(organisations, eq(organisations.id, sheetRevisions.organisationId))
    .where(eq(sheetRevisions.id, hit.id))
    .limit(1);
  if (!row) return { state: "unknown" };
  const base = { organisationName: row.organisationName, sheetTag: row.tag, label: row.label, approvedAt: row.decidedAt };
  if (row.status === "approved") return { state: "approved-current", ...base };

  const later = await db()
    .select({ status: sheetRevisions.status, label: sheetRevisions.label, decidedAt: sheetRevisions.decidedAt, ordinal: sheetRevisions.ordinal })
    .from(sheetRevisions)
    .where(and(eq(sheetRevisions.sheetId, hit.sheetId), gt(sheetRevisions.ordinal, hit.ordinal), inArray(sheetRevisions.status, ["approved", "superseded"])))
    .orderBy(desc(sheetRevisions.ordinal));
  const inForce = later.find((r) => r.status === "approved") ?? later[later.length - 1];
  return { state: "superseded", ...base, supersededBy: inForce ? { label: inForce.label, approvedAt: inForce.decidedAt } : null };
}
