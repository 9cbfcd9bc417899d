import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/ui/page-header";
import { readMessage } from "@/lib/mail/fake-mailbox";
import { LinkedText } from "../linked-text";
import { formatUtc, requireMailbox } from "../mailbox";

export const metadata: Metadata = { title: "Message", referrer: "no-referrer" };
export const dynamic = "force-dynamic";

export default async function MessagePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { actor, dir } = await requireMailbox();
  const message = await readMessage(dir, actor.organisationId, id);
  if (!message) notFound();

  return (
    <div className="space-y-6">
      <PageHeader
        eyebrow={
          <Link href="/admin/mailbox" className="hover:underline">
            ← Mailbox
          </Link>
        }
        title={message.subject || "(no subject)"}
      />
      <div className="panel p-5">
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-fen-500">From</dt>
          <dd className="break-all">{message.from || message.envelopeFrom || "—"}</dd>
          <dt className="text-fen-500">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="text-fen-500">Received</dt>
          <dd className="font-mono text-xs leading-5">{formatUtc(message.receivedAt)}</dd>
        </dl>
        <div className="mt-5 border-t border-fen-100 pt-5">
          <h2 className="sr-only">Message text</h2>
          <pre className="whitespace-pre-wrap break-words font-sans text-sm leading-6 text-fen-900">
            <LinkedText text={message.text || "(This message has no plain-text part.)"} />
          </pre>
        </div>
        {message.html ? <p className="mt-4 text-xs text-fen-500">The message also has an HTML version; only its plain text is shown here.</p> : null}
      </div>
    </div>
  );
}
