import type { Metadata } from "next";
import { listPendingInvitations, listUsers } from "@/db/queries/users";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { StatusBadge } from "@/components/ui/status-badge";
import { requirePageActor } from "@/lib/auth/guard";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { InviteForm } from "./invite-form";
import { RevokeButton } from "./revoke-button";
import { UserControls } from "./user-controls";

export const metadata: Metadata = { title: "Users" };

const formatUtc = (d: Date | null) => (d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "Never");

export default async function UsersPage() {
  const actor = await requirePageActor("users.manage");
  const [people, invitations] = await Promise.all([listUsers(actor.organisationId), listPendingInvitations(actor.organisationId)]);
  const activeAdmins = people.filter((p) => p.role === "admin" && p.status === "active").length;

  return (
    <div className="space-y-8">
      <PageHeader
        title="Users"
        description="Invite people to your organisation, set what they may do, and deactivate those who left. Every change is recorded in the audit log."
      />

      <section aria-labelledby="invite-heading" className="panel p-5">
        <h2 id="invite-heading" className="mb-1 text-base font-semibold text-fen-900">
          Invite someone
        </h2>
        <p className="mb-4 text-sm text-fen-600">
          They receive an e-mail with a single-use link, valid for 72 hours, to choose their name and password. Inviting the same address again replaces the earlier link.
        </p>
        <InviteForm />
      </section>

      <section aria-labelledby="people-heading" className="panel overflow-x-auto">
        <h2 id="people-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
          People ({people.length})
        </h2>
        {activeAdmins <= 1 ? (
          <p className="px-5 pb-3 text-sm text-fen-600">
            Your organisation has one active administrator. That person cannot be given another role or deactivated until someone else is an administrator.
          </p>
        ) : null}
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">E-mail</th>
              <th scope="col">Role</th>
              <th scope="col">Status</th>
              <th scope="col">Last sign-in</th>
              <th scope="col">Change</th>
            </tr>
          </thead>
          <tbody>
            {people.map((p) => (
              <tr key={p.id} className={p.status === "deactivated" ? "text-fen-500" : undefined}>
                <td className="font-medium">
                  {p.name}
                  {p.id === actor.id ? <span className="ml-2 text-xs font-normal text-fen-500">(you)</span> : null}
                </td>
                <td className="break-all">{p.email}</td>
                <td>{ROLE_LABELS[p.role]}</td>
                <td>{p.status === "active" ? <StatusBadge tone="pass">Active</StatusBadge> : <StatusBadge tone="archived">Deactivated</StatusBadge>}</td>
                <td className="whitespace-nowrap font-mono text-xs">{formatUtc(p.lastSignInAt)}</td>
                <td>
                  <UserControls user={{ id: p.id, name: p.name, role: p.role, status: p.status }} isSelf={p.id === actor.id} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section aria-labelledby="invitations-heading" className="panel overflow-x-auto">
        <h2 id="invitations-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
          Pending invitations ({invitations.length})
        </h2>
        {invitations.length === 0 ? (
          <EmptyState title="No pending invitations">Invitations appear here until they are accepted or revoked.</EmptyState>
        ) : (
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">E-mail</th>
                <th scope="col">Role</th>
                <th scope="col">Invited by</th>
                <th scope="col">Expires</th>
                <th scope="col">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {invitations.map((inv) => (
                <tr key={inv.id}>
                  <td className="break-all">{inv.email}</td>
                  <td>{ROLE_LABELS[inv.role]}</td>
                  <td>{inv.invitedByName ?? "—"}</td>
                  <td className="whitespace-nowrap">
                    <span className="font-mono text-xs">{formatUtc(inv.expiresAt)}</span>
                    {inv.expired ? (
                      <span className="ml-2">
                        <StatusBadge tone="warning">Expired</StatusBadge>
                      </span>
                    ) : null}
                  </td>
                  <td>
                    <RevokeButton invitationId={inv.id} email={inv.email} />
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
