import "server-only";
import { count, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { mailOutbox, type MAIL_STATUSES } from "@/db/schema";

/** The organisation's outgoing mail as the admin sees it (delivery state, not bodies). */
export interface OutboxItem {
  id: number;
  toAddress: string;
  subject: string;
  status: (typeof MAIL_STATUSES)[number];
  attempts: number;
  nextAttemptAt: Date;
  lastError: string | null;
  sentAt: Date | null;
  createdAt: Date;
}

export async function listOutbox(organisationId: number, limit = 30): Promise<OutboxItem[]> {
  return db()
    .select({
      id: mailOutbox.id,
      toAddress: mailOutbox.toAddress,
      subject: mailOutbox.subject,
      status: mailOutbox.status,
      attempts: mailOutbox.attempts,
      nextAttemptAt: mailOutbox.nextAttemptAt,
      lastError: mailOutbox.lastError,
      sentAt: mailOutbox.sentAt,
      createdAt: mailOutbox.createdAt,
    })
    .from(mailOutbox)
    .where(eq(mailOutbox.organisationId, organisationId))
    .orderBy(desc(mailOutbox.id))
    .limit(limit);
}

export async function outboxCounts(organisationId: number): Promise<Record<(typeof MAIL_STATUSES)[number], number>> {
  const rows = await db()
    .select({ status: mailOutbox.status, n: count() })
    .from(mailOutbox)
    .where(eq(mailOutbox.organisationId, organisationId))
    .groupBy(mailOutbox.status);
  const out = { pending: 0, sent: 0, failed: 0 };
  for (const r of rows) out[r.status] = r.n;
  return out;
}
