import "server-only";
import path from "node:path";
import { notFound } from "next/navigation";
import { requirePageActor, type Actor } from "@/lib/auth/guard";
import { env } from "@/lib/env";

/**
 * The mailbox pages exist only while the local fake SMTP server is in use (FAKE_SMTP=1);
 * otherwise they are a 404 like any page that does not exist.
 */
export async function requireMailbox(): Promise<{ actor: Actor; dir: string }> {
  const e = env();
  if (!e.FAKE_SMTP) notFound();
  const actor = await requirePageActor("mailbox.read");
  // The mailbox folder is runtime data, not part of the build: keep it out of file tracing.
  return { actor, dir: path.resolve(/*turbopackIgnore: true*/ process.cwd(), e.FAKE_MAILBOX_DIR) };
}

export const formatUtc = (d: Date | string) => `${new Date(d).toISOString().slice(0, 19).replace("T", " ")} UTC`;
