// Reads the fake SMTP server's mailbox folder: one JSON file per received message.
import { readFile, readdir } from "node:fs/promises";
import path from "node:path";

export interface Mail {
  id: string;
  to: string;
  envelopeTo: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

export async function readMailbox(dir: string): Promise<Mail[]> {
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith(".json")).sort();
  } catch {
    return [];
  }
  const out: Mail[] = [];
  for (const n of names) {
    try {
      out.push(JSON.parse(await readFile(path.join(dir, n), "utf8")) as Mail);
    } catch {
      // A file still being written is read on the next poll.
    }
  }
  return out;
}

/** Waits for a message to the address (the outbox sender runs every few seconds). */
export async function waitForMail(dir: string, to: string, timeoutMs = 30_000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  const wanted = to.toLowerCase();
  while (Date.now() < deadline) {
    const hit = (await readMailbox(dir)).find(
      (m) => m.envelopeTo.some((a) => a.toLowerCase() === wanted) || m.to.toLowerCase().includes(wanted),
    );
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`no mail to ${to} arrived in ${dir} within ${timeoutMs / 1000} s`);
}
