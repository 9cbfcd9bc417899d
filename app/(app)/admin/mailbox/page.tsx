import type { Metadata } from "next";
import Link from "next/link";
import { listOutbox, outboxCounts } from "@/db/queries/mail";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { StatusBadge } from "@/components/ui/status-badge";
import { listMessages } from "@/lib/mail/fake-mailbox";
import { formatUtc, requireMailbox } from "./mailbox";

export const metadata: Metadata = { title: "Mailbox" };
export const dynamic = "force-dynamic";

export default async function MailboxPage() {
  const { actor, dir } = await requireMailbox();
  const [messages, queue, counts] = await Promise.all([listMessages(dir, actor.organisationId), listOutbox(actor.organisationId, 20), outboxCounts(actor.organisationId)]);

  return (
    <div className="space-y-8">
      <PageHeader
        title="Mailbox"
        description="This installation sends e-mail to a local test mail server instead of the internet. Every message sent for your organisation lands here, newest first, so you can open invitation links yourself."
      />

      <section aria-labelledby="received-heading" className="panel overflow-x-auto">
        <h2 id="received-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
          Received ({messages.length})
        </h2>
        {messages.length === 0 ? (
          <EmptyState title="No messages yet">
            Messages appear a few seconds after they are sent. If an invitation does not arrive, check below that it left the outbox and that the local mail server is running (npx tsx scripts/fake-smtp.ts).
          </EmptyState>
        ) : (
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Received</th>
                <th scope="col">To</th>
                <th scope="col">Subject</th>
              </tr>
            </thead>
            <tbody>
              {messages.map((m) => (
                <tr key={m.id}>
                  <td className="whitespace-nowrap font-mono text-xs">{formatUtc(m.receivedAt)}</td>
                  <td className="break-all">{m.to}</td>
                  <td>
                    <Link href={`/admin/mailbox/${m.id}`} className="font-medium text-copper-700 underline-offset-2 hover:underline">
                      {m.subject || "(no subject)"}
                    </Link>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section aria-labelledby="queue-heading" className="panel overflow-x-auto">
        <h2 id="queue-heading" className="px-5 pt-5 pb-1 text-base font-semibold text-fen-900">
          Outbox
        </h2>
        <p className="px-5 pb-3 text-sm text-fen-600">
          {counts.pending} waiting · {counts.sent} sent · {counts.failed} given up. Waiting messages are retried with growing pauses (30 s, 1 min, 2 min … up to 1 h) while the mail server is unreachable.
        </p>
        {queue.length === 0 ? null : (
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Queued</th>
                <th scope="col">To</th>
                <th scope="col">Subject</th>
                <th scope="col">State</th>
              </tr>
            </thead>
            <tbody>
              {queue.map((q) => (
                <tr key={q.id}>
                  <td className="whitespace-nowrap font-mono text-xs">{formatUtc(q.createdAt)}</td>
                  <td className="break-all">{q.toAddress}</td>
                  <td>{q.subject}</td>
                  <td>
                    {q.status === "sent" ? (
                      <StatusBadge tone="pass">Sent</StatusBadge>
                    ) : q.status === "failed" ? (
                      <StatusBadge tone="fail">Given up after {q.attempts} attempts</StatusBadge>
                    ) : (
                      <StatusBadge tone="warning">{q.attempts === 0 ? "Waiting" : `Retry ${q.attempts} at ${formatUtc(q.nextAttemptAt).slice(11)}`}</StatusBadge>
                    )}
                    {q.lastError && q.status !== "sent" ? <p className="mt-1 text-xs text-fen-500">{q.lastError}</p> : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
