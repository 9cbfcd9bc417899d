import type { Role } from "@/db/schema";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { env } from "@/lib/env";

/** A rendered message: plain text (always) and a simple HTML alternative. */
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

/** Absolute link into the app for a path such as `/sheets/12`. */
export function appLink(path: string): string {
  return new URL(path, env().APP_URL).toString();
}

function escapeHtml(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

const FOOTER = "Ohmstead: calculation sheets for panel builders. Results are design aids; the governing standard, local codes and a qualified engineer decide.";

/** Plain paragraphs + one call-to-action link, rendered both ways. */
function render(subject: string, paragraphs: string[], action: { label: string; url: string }, after: string[] = []): MailContent {
  const text = [...paragraphs, `${action.label}: ${action.url}`, ...after, "--", FOOTER].join("\n\n") + "\n";
  const p = (s: string) => `<p style="margin:0 0 14px;white-space:pre-line">${escapeHtml(s)}</p>`;
  const html = [
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#0f1a1c;background:#f2f6f6;padding:24px">`,
    `<div style="max-width:560px;margin:0 auto;background:#fff;border:1px solid #bfd3d3;border-radius:8px;padding:24px">`,
    `<div style="font-weight:700;font-size:18px;color:#263d40;margin-bottom:16px">Ohmstead</div>`,
    ...paragraphs.map(p),
    `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#c24d21;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>`,
    `<p style="margin:0 0 14px;font-size:12px;color:#467174">Or open: ${escapeHtml(action.url)}</p>`,
    ...after.map(p),
    `<p style="margin:24px 0 0;font-size:12px;color:#628d8f">${escapeHtml(FOOTER)}</p>`,
    `</div></body></html>`,
  ].join("\n");
  return { subject, text, html };
}

function formatUtc(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

export function inviteMail(p: { organisationName: string; inviterName: string; role: Role; token: string; expiresAt: Date }): MailContent {
  return render(
    `You are invited to ${p.organisationName} on Ohmstead`,
    [
      `${p.inviterName} invited you to join ${p.organisationName} on Ohmstead as ${ROLE_LABELS[p.role]}.`,
      `Open the link below to choose your name and password. The link works once and expires at ${formatUtc(p.expiresAt)}.`,
    ],
    { label: "Accept the invitation", url: appLink(`/invite/${encodeURIComponent(p.token)}`) },
    ["If you did not expect this invitation, ignore this e-mail; nothing happens unless the link is opened and accepted."],
  );
}

export interface SheetMailParams {
  projectName: string;
  sheetTag: string;
  sheetTitle: string;
  revisionLabel: string;
  /** Path inside the app, e.g. `/projects/3/sheets/12`. */
  sheetPath: string;
}

const sheetRef = (p: SheetMailParams) => `${p.sheetTag} "${p.sheetTitle}" revision ${p.revisionLabel} (project ${p.projectName})`;

export function reviewRequestedMail(p: SheetMailParams & { submitterName: string }): MailContent {
  return render(
    `Review requested: ${p.sheetTag} rev ${p.revisionLabel} (${p.projectName})`,
    [`${p.submitterName} submitted ${sheetRef(p)} for checking.`, "Check the inputs and results, then approve the revision or return it with a comment."],
    { label: "Open the sheet", url: appLink(p.sheetPath) },
  );
}

export function sheetApprovedMail(p: SheetMailParams & { approverName: string }): MailContent {
  return render(
    `Approved: ${p.sheetTag} rev ${p.revisionLabel} (${p.projectName})`,
    [`${p.approverName} approved ${sheetRef(p)}.`, "The approved revision is now locked; any change starts a new revision."],
    { label: "Open the sheet", url: appLink(p.sheetPath) },
  );
}

export function sheetReturnedMail(p: SheetMailParams & { reviewerName: string; comment: string }): MailContent {
  return render(
    `Returned: ${p.sheetTag} rev ${p.revisionLabel} (${p.projectName})`,
    [`${p.reviewerName} returned ${sheetRef(p)} with this comment:`, p.comment.trim() || "(no comment)"],
    { label: "Open the sheet", url: appLink(p.sheetPath) },
  );
}
