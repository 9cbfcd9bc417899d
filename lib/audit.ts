import type { Tx } from "@/db/client";
import { auditEvents, type AuditEvent } from "@/db/schema";

/** Writes an audit event inside the caller's transaction, so the change and its record commit together. */
export async function audit(
  tx: Tx,
  e: { organisationId: number; actorId: number | null; event: AuditEvent; entityType: string; entityId?: number | null; details?: Record<string, unknown> },
) {
  await tx.insert(auditEvents).values({
    organisationId: e.organisationId,
    actorId: e.actorId,
    event: e.event,
    entityType: e.entityType,
    entityId: e.entityId ?? null,
    details: e.details ?? {},
  });
}
