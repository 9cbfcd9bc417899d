import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { mkdtemp, rm } from "node:fs/promises";
import { createServer } from "node:net";
import os from "node:os";
import path from "node:path";
import nodemailer, { type Transporter } from "nodemailer";
import { eq } from "drizzle-orm";
import type { SMTPServer } from "smtp-server";
import { closeDb, db } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { enqueueMail } from "@/lib/mail/outbox";
import { OUTBOX, backoffMs, runOutboxOnce } from "@/lib/mail/sender";
import { boundPort, close, createFakeSmtpServer, listen } from "@/lib/mail/fake-smtp-server";
import { listMessages, readMessage, storeMessage } from "@/lib/mail/fake-mailbox";
import { parseMail } from "@/lib/mail/mime";
import { makeOrg, resetDb } from "../support/db";

interface Received {
  raw: string;
  to: string[];
}

let server: SMTPServer;
let port: number;
let received: Received[] = [];
let transport: Transporter;
let orgId: number;

const transportTo = (p: number) => nodemailer.createTransport({ host: "127.0.0.1", port: p, secure: false, ignoreTLS: true, connectionTimeout: 2000 });

beforeAll(async () => {
  server = createFakeSmtpServer((raw, envelope) => {
    received.push({ raw, to: envelope.to });
  });
  await listen(server, 0);
  port = boundPort(server);
});

afterAll(async () => {
  await close(server);
  await closeDb();
});

beforeEach(async () => {
  await resetDb();
  received = [];
  orgId = (await makeOrg("Copperfield Panels")).id;
  transport = transportTo(port);
});

afterEach(() => {
  transport.close();
});

async function queue(n: number, subject = (i: number) => `Message ${i}`) {
  await db().transaction(async (tx) => {
    for (let i = 0; i < n; i++) await enqueueMail(tx, { organisationId: orgId, to: `person${i}@example.test`, subject: subject(i), text: `Body ${i}` });
  });
}

/** A TCP port with nothing listening on it. */
async function closedPort(): Promise<number> {
  const s = createServer();
  await new Promise<void>((r) => s.listen(0, "127.0.0.1", () => r()));
  const p = (s.address() as { port: number }).port;
  await new Promise<void>((r) => s.close(() => r()));
  return p;
}

describe("outbox sender", () => {
  it("sends a queued message over SMTP and marks it sent", async () => {
    await db().transaction((tx) =>
      enqueueMail(tx, {
        organisationId: orgId,
        to: "reviewer@example.test",
        subject: "Prüfung bestanden ✓",
        text: "Line one.\nOpen: http://127.0.0.1:3000/invite/abc_DEF-123\n",
        html: "<p>Line one.</p>",
      }),
    );
    const run = await runOutboxOnce({ transport });
    expect(run).toEqual({ claimed: 1, sent: 1, retrying: 0, failed: 0 });
    expect(received).toHaveLength(1);
    expect(received[0]?.to).toEqual(["reviewer@example.test"]);
    const mail = parseMail(received[0]!.raw);
    expect(mail.subject).toBe("Prüfung bestanden ✓");
    expect(mail.text).toContain("Open: http://127.0.0.1:3000/invite/abc_DEF-123");
    expect(mail.html).toBe("<p>Line one.</p>");
    expect(mail.headers["x-ohmstead-organisation"]).toBe(String(orgId));

    const [row] = await db().select().from(mailOutbox);
    expect(row).toMatchObject({ status: "sent", attempts: 0, lastError: null });
    expect(row?.sentAt).toBeInstanceOf(Date);
    expect(await runOutboxOnce({ transport })).toEqual({ claimed: 0, sent: 0, retrying: 0, failed: 0 });
    expect(received).toHaveLength(1);
  });

  it("while SMTP is down: counts the attempt, schedules a retry with back-off, loses nothing; delivers once SMTP is back", async () => {
    await queue(2);
    const down = transportTo(await closedPort());
    const before = Date.now();
    const run = await runOutboxOnce({ transport: down });
    down.close();
    expect(run).toEqual({ claimed: 2, sent: 0, retrying: 2, failed: 0 });
    const rows = await db().select().from(mailOutbox);
    for (const r of rows) {
      expect(r.status).toBe("pending");
      expect(r.attempts).toBe(1);
      expect(r.lastError).toMatch(/ECONNREFUSED|connect/i);
      expect(r.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(before + OUTBOX.baseDelayMs - 1000);
    }
    // Not due yet: nothing is claimed, even with SMTP back.
    expect((await runOutboxOnce({ transport })).claimed).toBe(0);
    // Once due, both are delivered.
    const later = new Date(Date.now() + OUTBOX.baseDelayMs + 5000);
    expect(await runOutboxOnce({ transport, now: later })).toEqual({ claimed: 2, sent: 2, retrying: 0, failed: 0 });
    expect(received.map((r) => r.to[0]).sort()).toEqual(["person0@example.test", "person1@example.test"]);
  });

  it("backs off exponentially up to an hour and gives up after the last attempt", async () => {
    expect([1, 2, 3, 4].map(backoffMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(backoffMs(8)).toBe(60 * 60_000);
    expect(backoffMs(20)).toBe(60 * 60_000);

    await queue(1);
    await db().update(mailOutbox).set({ attempts: OUTBOX.maxAttempts - 1 }).where(eq(mailOutbox.status, "pending"));
    const down = transportTo(await closedPort());
    expect(await runOutboxOnce({ transport: down })).toMatchObject({ failed: 1 });
    down.close();
    const [row] = await db().select().from(mailOutbox);
    expect(row).toMatchObject({ status: "failed", attempts: OUTBOX.maxAttempts });
    expect((await runOutboxOnce({ transport, now: new Date(Date.now() + 2 * 3600_000) })).claimed).toBe(0);
  });

  it("two concurrent senders never send the same row twice", async () => {
    await queue(27);
    const drain = async (tr: Transporter) => {
      let sent = 0;
      for (;;) {
        const r = await runOutboxOnce({ transport: tr, batchSize: 4 });
        if (r.claimed === 0) return sent;
        sent += r.sent;
      }
    };
    // Two senders with their own SMTP connections and database transactions, as two app instances would have.
    const second = transportTo(port);
    const [a, b] = await Promise.all([drain(transport), drain(second)]);
    second.close();
    expect(a + b).toBe(27);
    expect(received).toHaveLength(27);
    const ids = received.map((r) => parseMail(r.raw).headers["x-ohmstead-outbox-id"]);
    expect(new Set(ids).size).toBe(27);
    const rows = await db().select().from(mailOutbox).where(eq(mailOutbox.status, "sent"));
    expect(rows).toHaveLength(27);
  });
});

describe("fake mailbox store and MIME reader", () => {
  let dir: string;
  beforeEach(async () => {
    dir = await mkdtemp(path.join(os.tmpdir(), "ohmstead-mailbox-"));
  });
  afterEach(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it("decodes quoted-printable and base64 bodies nodemailer produces, and shows each organisation only its mail", async () => {
    const longLine = "A line that is long enough to be wrapped by quoted-printable soft line breaks, with ümlauts and a link http://127.0.0.1:3000/invite/XYZ";
    const greek = "Ωμέγα ".repeat(40).trim();
    const other = await makeOrg("Another Works");
    await db().transaction(async (tx) => {
      await enqueueMail(tx, { organisationId: orgId, to: "qp@example.test", subject: "Quoted", text: longLine, html: `<p>${longLine}</p>` });
      await enqueueMail(tx, { organisationId: other.id, to: "b64@example.test", subject: "Ελληνικά", text: greek });
    });
    await runOutboxOnce({ transport });
    expect(received).toHaveLength(2);
    const stored = [];
    for (const r of received) stored.push(await storeMessage(dir, r.raw, { from: "no-reply@ohmstead.invalid", to: r.to }));

    const mine = await listMessages(dir, orgId);
    expect(mine.map((m) => m.subject)).toEqual(["Quoted"]);
    const full = await readMessage(dir, orgId, mine[0]!.id);
    expect(full?.text.trim()).toBe(longLine);
    expect(full?.html).toContain(longLine);

    const theirs = await listMessages(dir, other.id);
    expect(theirs.map((m) => m.subject)).toEqual(["Ελληνικά"]);
    expect((await readMessage(dir, other.id, theirs[0]!.id))?.text.trim()).toBe(greek);
    // Another organisation's message id reads as nothing; so does a path trick.
    expect(await readMessage(dir, orgId, theirs[0]!.id)).toBeNull();
    expect(await readMessage(dir, orgId, "../../etc/passwd")).toBeNull();
    expect(stored.every((s) => s.envelopeFrom === "no-reply@ohmstead.invalid")).toBe(true);
  });

  it("an empty or missing mailbox folder lists nothing", async () => {
    expect(await listMessages(path.join(dir, "missing"), orgId)).toEqual([]);
  });
});
