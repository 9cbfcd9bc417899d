import { mkdir, readFile, readdir, writeFile } from "node:fs/promises";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { parseMail } from "./mime";

/**
 * The local fake SMTP server's store: one JSON file per received message. The admin
 * mailbox page reads it back, showing each organisation only its own mail (the sender
 * stamps every message with ORGANISATION_HEADER).
 */
export const ORGANISATION_HEADER = "X-Ohmstead-Organisation";

export interface StoredMessage {
  id: string;
  organisationId: number | null;
  envelopeFrom: string | null;
  envelopeTo: string[];
  from: string;
  to: string;
  subject: string;
  date: string | null;
  receivedAt: string;
  text: string;
  html: string | null;
}

export type MessageSummary = Pick<StoredMessage, "id" | "organisationId" | "to" | "subject" | "receivedAt">;

const ID = /^[0-9]{13}-[0-9a-f]{8}$/;

export function isMessageId(id: string): boolean {
  return ID.test(id);
}

export async function storeMessage(
  dir: string,
  raw: string,
  envelope: { from: string | null; to: string[] },
  now = new Date(),
): Promise<StoredMessage> {
  const parsed = parseMail(raw);
  const org = Number(parsed.headers[ORGANISATION_HEADER.toLowerCase()]);
  const message: StoredMessage = {
    id: `${String(now.getTime()).padStart(13, "0")}-${randomBytes(4).toString("hex")}`,
    organisationId: Number.isInteger(org) && org > 0 ? org : null,
    envelopeFrom: envelope.from,
    envelopeTo: envelope.to,
    from: parsed.from,
    to: parsed.to || envelope.to.join(", "),
    subject: parsed.subject,
    date: parsed.date,
    receivedAt: now.toISOString(),
    text: parsed.text,
    html: parsed.html,
  };
  await mkdir(dir, { recursive: true });
  await writeFile(path.join(dir, `${message.id}.json`), JSON.stringify(message, null, 2) + "\n", "utf8");
  return message;
}

async function readStored(file: string): Promise<StoredMessage | null> {
  try {
    return JSON.parse(await readFile(file, "utf8")) as StoredMessage;
  } catch {
    return null;
  }
}

/** Newest first; only messages of the given organisation. A missing folder is an empty mailbox. */
export async function listMessages(dir: string, organisationId: number, limit = 200): Promise<MessageSummary[]> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return [];
  }
  const ids = names
    .filter((n) => n.endsWith(".json") && isMessageId(n.slice(0, -5)))
    .map((n) => n.slice(0, -5))
    .sort()
    .reverse();
  const out: MessageSummary[] = [];
  for (const id of ids) {
    if (out.length >= limit) break;
    const m = await readStored(path.join(dir, `${id}.json`));
    if (m && m.organisationId === organisationId) out.push({ id: m.id, organisationId: m.organisationId, to: m.to, subject: m.subject, receivedAt: m.receivedAt });
  }
  return out;
}

/** One message of the given organisation, or null (unknown id, or another organisation's mail). */
export async function readMessage(dir: string, organisationId: number, id: string): Promise<StoredMessage | null> {
  if (!isMessageId(id)) return null;
  const m = await readStored(path.join(dir, `${id}.json`));
  return m && m.organisationId === organisationId ? m : null;
}
