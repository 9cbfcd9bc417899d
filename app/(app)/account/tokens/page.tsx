import type { Metadata } from "next";
import Link from "next/link";
import { DateTime } from "@/components/ui/date-time";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { listTokens } from "@/lib/auth/tokens";
import { CreateTokenForm } from "./create-token-form";
import { RevokeTokenButton } from "./revoke-token-button";

export const metadata: Metadata = { title: "API tokens" };

export default async function ApiTokensPage() {
  const actor = await requirePageActor("token.manage");
  const tokens = await listTokens(actor);
  const active = tokens.filter((t) => !t.revokedAt);
  const revoked = tokens.filter((t) => t.revokedAt);

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow="Account"
        title="API tokens"
        description={
          <>
            A token lets a script or another program use the <Link href="/api-docs" className="font-medium text-copper-700 underline underline-offset-2">Ohmstead API</Link>{" "}
            as you, with your role ({ROLE_LABELS[actor.role].toLowerCase()}) and only within your organisation. Send it as <code className="font-mono">Authorization: Bearer &lt;token&gt;</code>.
          </>
        }
      />

      <section aria-labelledby="create-heading" className="panel p-5">
        <h2 id="create-heading" className="mb-1 text-base font-semibold text-fen-900">
          Create a token
        </h2>
        <p className="mb-4 text-sm text-fen-600">Use one token per program, so you can revoke one without stopping the others.</p>
        <CreateTokenForm />
      </section>

      <section aria-labelledby="tokens-heading" className="panel overflow-x-auto">
        <h2 id="tokens-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
          Your tokens ({active.length})
        </h2>
        {active.length === 0 ? (
          <EmptyState title="No active tokens">Create one above when a program needs to read or write your sheets.</EmptyState>
        ) : (
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">Starts with</th>
                <th scope="col">Created</th>
                <th scope="col">Last used</th>
                <th scope="col">
                  <span className="sr-only">Revoke</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {active.map((t) => (
                <tr key={t.id}>
                  <td className="font-medium text-fen-900">{t.name}</td>
                  <td>
                    <code className="font-mono text-sm">{t.prefix}…</code>
                  </td>
                  <td>
                    <DateTime value={t.createdAt} />
                  </td>
                  <td>{t.lastUsedAt ? <DateTime value={t.lastUsedAt} /> : <span className="text-fen-500">Never</span>}</td>
                  <td className="text-right">
                    <RevokeTokenButton tokenId={t.id} name={t.name} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      {revoked.length > 0 ? (
        <section aria-labelledby="revoked-heading" className="panel overflow-x-auto">
          <h2 id="revoked-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
            Revoked ({revoked.length})
          </h2>
          <table className="data-table text-fen-500">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">Starts with</th>
                <th scope="col">Created</th>
                <th scope="col">Last used</th>
                <th scope="col">Revoked</th>
              </tr>
            </thead>
            <tbody>
              {revoked.map((t) => (
                <tr key={t.id}>
                  <td>{t.name}</td>
                  <td>
                    <code className="font-mono text-sm">{t.prefix}…</code>
                  </td>
                  <td>
                    <DateTime value={t.createdAt} />
                  </td>
                  <td>{t.lastUsedAt ? <DateTime value={t.lastUsedAt} /> : "Never"}</td>
                  <td>
                    <DateTime value={t.revokedAt!} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ) : null}
    </div>
  );
}
