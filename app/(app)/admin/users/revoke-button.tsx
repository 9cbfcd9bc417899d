"use client";

import { ConfirmActionButton } from "@/components/forms/confirm-action-button";
import { revokeInvitationAction } from "./actions";

export function RevokeButton({ invitationId, email }: { invitationId: number; email: string }) {
  return (
    <ConfirmActionButton
      confirm={`Withdraw the invitation to ${email}? The link in the e-mail will stop working.`}
      run={() => revokeInvitationAction({ invitationId })}
      label="Revoke"
      pendingLabel="Revoking…"
      ariaLabel={`Revoke the invitation to ${email}`}
    />
  );
}
