import "server-only";
import type { Tx } from "@/db/client";
import { activeContact, activeLeads } from "@/db/queries/sheets";
import { enqueueMail } from "@/lib/mail/outbox";
import { reviewRequestedMail, sheetApprovedMail, sheetReturnedMail, type MailContent, type SheetMailParams } from "@/lib/mail/templates";

/**
 * The e-mails of the review workflow, written to the outbox inside the transaction of
 * the transition that causes them: they exist exactly when the transition commits.
 */

/** The sheet a notification is about. */
export interface SheetMailContext {
  organisationId: number;
  project: { id: number; name: string };
  sheet: { id: number; tag: string; title: string };
  revisionLabel: string;
  /** Author of the revision. */
  authorId: number;
}

/** Path of a sheet inside the app; mails link to APP_URL + this path. */
export function sheetPath(projectId: number, sheetId: number): string {
  return `/projects/${projectId}/sheets/${sheetId}`;
}

function params(c: SheetMailContext): SheetMailParams {
  return {
    projectName: c.project.name,
    sheetTag: c.sheet.tag,
    sheetTitle: c.sheet.title,
    revisionLabel: c.revisionLabel,
    sheetPath: sheetPath(c.project.id, c.sheet.id),
  };
}

async function send(tx: Tx, organisationId: number, to: string, m: MailContent) {
  await enqueueMail(tx, { organisationId, to, subject: m.subject, text: m.text, html: m.html });
}

/**
 * "Review requested" to every active lead of the organisation except the revision's
 * author (who may not check their own sheet). Returns the recipients' addresses.
 */
export async function notifyReviewRequested(tx: Tx, c: SheetMailContext & { submitterName: string }): Promise<string[]> {
  const leads = (await activeLeads(tx, c.organisationId)).filter((l) => l.id !== c.authorId);
  const mail = reviewRequestedMail({ ...params(c), submitterName: c.submitterName });
  for (const l of leads) await send(tx, c.organisationId, l.email, mail);
  return leads.map((l) => l.email);
}

/** "Approved" to the revision's author (none if the author was deactivated). Returns the recipients. */
export async function notifyApproved(tx: Tx, c: SheetMailContext & { approverName: string }): Promise<string[]> {
  const author = await activeContact(tx, c.organisationId, c.authorId);
  if (!author) return [];
  await send(tx, c.organisationId, author.email, sheetApprovedMail({ ...params(c), approverName: c.approverName }));
  return [author.email];
}

/** "Returned" with the reviewer's comment to the revision's author. Returns the recipients. */
export async function notifyReturned(tx: Tx, c: SheetMailContext & { reviewerName: string; comment: string }): Promise<string[]> {
  const author = await activeContact(tx, c.organisationId, c.authorId);
  if (!author) return [];
  await send(tx, c.organisationId, author.email, sheetReturnedMail({ ...params(c), reviewerName: c.reviewerName, comment: c.comment }));
  return [author.email];
}
