import nodemailer, { type Transporter } from "nodemailer";
import { and, asc, eq, inArray, lte } from "drizzle-orm";
import { db } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { env } from "@/lib/env";
import { ORGANISATION_HEADER } from "./fake-mailbox";

/**
 * Delivers the mail outbox. Each run claims due rows in a short transaction with
 * SELECT … FOR UPDATE SKIP LOCKED and leases them (moves next_attempt_at past the send),
 * so two app instances never pick the same row; then sends outside the transaction and
 * marks each row sent, or schedules a retry with exponential back-off. Delivery is
 * at-least-once: a crash between sending and marking resends after the lease.
 */
export const OUTBOX = {
  batchSize: 10,
  /** Longer than a whole batch can take with the transport timeouts below. */
  leaseMs: 15 * 60_000,
  baseDelayMs: 30_000,
  maxDelayMs: 60 * 60_000,
  maxAttempts: 10,
  intervalMs: 2_000,
} as const;

/** Wait after the n-th failed attempt: 30 s × 2^(n−1), at most 1 h. */
export function backoffMs(failedAttempts: number): number {
  return Math.min(OUTBOX.maxDelayMs, OUTBOX.baseDelayMs * 2 ** Math.max(0, failedAttempts - 1));
}

/** The SMTP transport from the environment, or null when SMTP_HOST is unset. */
export function smtpTransport(): Transporter | null {
  const e = env();
  if (!e.SMTP_HOST) return null;
  return nodemailer.createTransport({
    host: e.SMTP_HOST,
    port: e.SMTP_PORT,
    secure: e.SMTP_PORT === 465,
    auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? "" } : undefined,
    // The local fake server speaks plain SMTP only.
    ignoreTLS: e.FAKE_SMTP,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
}

interface Claimed {
  id: number;
  organisationId: number | null;
  toAddress: string;
  subject: string;
  textBody: string;
  htmlBody: string | null;
  attempts: number;
}

async function claimDue(now: Date, limit: number): Promise<Claimed[]> {
  return db().transaction(async (tx) => {
    const rows = await tx
      .select({
        id: mailOutbox.id,
        organisationId: mailOutbox.organisationId,
        toAddress: mailOutbox.toAddress,
        subject: mailOutbox.subject,
        textBody: mailOutbox.textBody,
        htmlBody: mailOutbox.htmlBody,
        attempts: mailOutbox.attempts,
      })
      .from(mailOutbox)
      .where(and(eq(mailOutbox.status, "pending"), lte(mailOutbox.nextAttemptAt, now)))
      .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (rows.length > 0) {
      await tx
        .update(mailOutbox)
        .set({ nextAttemptAt: new Date(now.getTime() + OUTBOX.leaseMs) })
        .where(inArray(mailOutbox.id, rows.map((r) => r.id)));
    }
    return rows;
  });
}

async function markSent(id: number) {
  await db().update(mailOutbox).set({ status: "sent", sentAt: new Date(), lastError: null }).where(eq(mailOutbox.id, id));
}

async function markFailed(row: Claimed, err: unknown): Promise<"retry" | "failed"> {
  const attempts = row.attempts + 1;
  const gaveUp = attempts >= OUTBOX.maxAttempts;
  const message = err instanceof Error ? err.message : String(err);
  await db()
    .update(mailOutbox)
    .set({
      attempts,
      status: gaveUp ? "failed" : "pending",
      nextAttemptAt: new Date(Date.now() + backoffMs(attempts)),
      lastError: message.slice(0, 1000),
    })
    .where(eq(mailOutbox.id, row.id));
  return gaveUp ? "failed" : "retry";
}

export interface OutboxRun {
  claimed: number;
  sent: number;
  retrying: number;
  failed: number;
}

/** One pass: claim a batch of due messages and try each once. */
export async function runOutboxOnce(opts: { transport?: Transporter; now?: Date; batchSize?: number } = {}): Promise<OutboxRun> {
  const transport = opts.transport ?? smtpTransport();
  if (!transport) throw new Error("runOutboxOnce: SMTP_HOST is not set");
  const rows = await claimDue(opts.now ?? new Date(), opts.batchSize ?? OUTBOX.batchSize);
  const run: OutboxRun = { claimed: rows.length, sent: 0, retrying: 0, failed: 0 };
  const from = env().MAIL_FROM;
  for (const row of rows) {
    try {
      await transport.sendMail({
        from,
        to: row.toAddress,
        subject: row.subject,
        text: row.textBody,
        ...(row.htmlBody ? { html: row.htmlBody } : {}),
        headers: {
          "X-Ohmstead-Outbox-Id": String(row.id),
          ...(row.organisationId ? { [ORGANISATION_HEADER]: String(row.organisationId) } : {}),
        },
      });
    } catch (err) {
      const outcome = await markFailed(row, err);
      run[outcome === "failed" ? "failed" : "retrying"]++;
      continue;
    }
    await markSent(row.id);
    run.sent++;
  }
  return run;
}

const g = globalThis as unknown as { ohmsteadOutboxSender?: { stop(): void } };

/**
 * Starts the background sender (every 2 s) once per process. Off when OUTBOX_SENDER=off
 * or SMTP_HOST is unset; mail then waits in the outbox, nothing is lost.
 */
export function startOutboxSender(): { stop(): void } | null {
  if (g.ohmsteadOutboxSender) return g.ohmsteadOutboxSender;
  const e = env();
  if (e.OUTBOX_SENDER === "off" || !e.SMTP_HOST) {
    console.info(`[ohmstead] mail outbox sender off (${e.OUTBOX_SENDER === "off" ? "OUTBOX_SENDER=off" : "SMTP_HOST not set"}); mail stays queued`);
    return null;
  }
  const transport = smtpTransport();
  if (!transport) return null;
  let running = false;
  let lastProblem = "";
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    runOutboxOnce({ transport })
      .then((r) => {
        if (r.retrying + r.failed > 0) console.warn(`[ohmstead] mail outbox: ${r.sent} sent, ${r.retrying} to retry, ${r.failed} given up`);
        lastProblem = "";
      })
      .catch((err: unknown) => {
        const msg = err instanceof Error ? err.message : String(err);
        if (msg !== lastProblem) console.error(`[ohmstead] mail outbox run failed: ${msg}`);
        lastProblem = msg;
      })
      .finally(() => {
        running = false;
      });
  }, OUTBOX.intervalMs);
  timer.unref();
  const handle = {
    stop() {
      clearInterval(timer);
      transport.close();
      g.ohmsteadOutboxSender = undefined;
    },
  };
  g.ohmsteadOutboxSender = handle;
  console.info(`[ohmstead] mail outbox sender on (SMTP ${e.SMTP_HOST}:${e.SMTP_PORT})`);
  return handle;
}
