import type { Metadata } from "next";
import Link from "next/link";
import { INVITATION_REFUSALS, findInvitation } from "@/db/queries/users";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AcceptForm } from "./accept-form";

export const metadata: Metadata = {
  title: "Accept invitation",
  // The token is in the URL: never send it on as a referrer.
  referrer: "no-referrer",
  robots: { index: false, follow: false },
};

const formatUtc = (d: Date) => `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;

function Refusal({ title, message }: { title: string; message: string }) {
  return (
    <div className="panel p-6 sm:p-8">
      <h1 className="text-xl font-semibold text-fen-950">{title}</h1>
      <p className="mt-2 text-sm text-fen-700">{message}</p>
      <p className="mt-6 text-sm">
        <Link href="/login" className="font-semibold text-copper-700 underline-offset-2 hover:underline">
          Go to sign-in
        </Link>
      </p>
    </div>
  );
}

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await findInvitation(token);
  if (!invitation) return <Refusal title="Invitation not found" message="This invitation link is not valid. Check that the whole link was copied, or ask your administrator for a new invitation." />;
  if (invitation.state === "expired") return <Refusal title="Invitation expired" message={INVITATION_REFUSALS.expired} />;
  if (invitation.state === "used") return <Refusal title="Invitation already used" message={INVITATION_REFUSALS.used} />;
  if (invitation.state === "revoked") return <Refusal title="Invitation withdrawn" message={INVITATION_REFUSALS.revoked} />;

  return (
    <div className="panel p-6 sm:p-8">
      <h1 className="text-xl font-semibold text-fen-950">Join {invitation.organisationName}</h1>
      <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-fen-500">Organisation</dt>
        <dd className="font-medium text-fen-900">{invitation.organisationName}</dd>
        <dt className="text-fen-500">Role</dt>
        <dd className="font-medium text-fen-900">{ROLE_LABELS[invitation.role]}</dd>
        <dt className="text-fen-500">E-mail</dt>
        <dd className="break-all font-medium text-fen-900">{invitation.email}</dd>
        <dt className="text-fen-500">Link expires</dt>
        <dd className="text-fen-900">{formatUtc(invitation.expiresAt)}</dd>
      </dl>
      <p className="mt-4 text-sm text-fen-600">Choose the name others will see on your sheets and reviews, and a password.</p>
      <AcceptForm token={token} email={invitation.email} />
    </div>
  );
}
