import type { Tx } from "@/db/client";
import { mailOutbox } from "@/db/schema";

export interface OutgoingMail {
  /** null for mail that belongs to no organisation. */
  organisationId: number | null;
  to: string;
  subject: string;
  text: string;
  html?: string | null;
}

const SUBJECT_MAX = 250;

/**
 * Writes a message to the outbox inside the caller's transaction: the mail exists
 * exactly when the change that caused it commits. The sender delivers it later.
 */
export async function enqueueMail(tx: Tx, mail: OutgoingMail): Promise<number> {
  const to = mail.to.trim();
  if (!to || to.length > 254 || /[\r\n]/.test(to)) throw new Error(`enqueueMail: invalid recipient "${to.slice(0, 40)}"`);
  const subject = mail.subject.replace(/[\r\n]+/g, " ").trim();
  const [row] = await tx
    .insert(mailOutbox)
    .values({
      organisationId: mail.organisationId,
      toAddress: to,
      subject: subject.length > SUBJECT_MAX ? `${subject.slice(0, SUBJECT_MAX - 1)}…` : subject,
      textBody: mail.text,
      htmlBody: mail.html ?? null,
    })
    .$returningId();
  if (!row) throw new Error("enqueueMail: insert returned no id");
  return row.id;
}
