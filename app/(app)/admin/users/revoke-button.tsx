"use client";

import { useState, useTransition } from "react";
import { revokeInvitationAction } from "./actions";

export function RevokeButton({ invitationId, email }: { invitationId: number; email: string }) {
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const revoke = () => {
    if (!window.confirm(`Withdraw the invitation to ${email}? The link in the e-mail will stop working.`)) return;
    setError(null);
    startTransition(async () => {
      const res = await revokeInvitationAction({ invitationId }).catch(() => null);
      if (!res) setError("The server could not be reached. Try again.");
      else if (!res.ok) setError(res.error.message);
    });
  };
  return (
    <div>
      <button type="button" className="btn-secondary py-1.5" disabled={pending} onClick={revoke} aria-label={`Revoke the invitation to ${email}`}>
        {pending ? "Revoking…" : "Revoke"}
      </button>
      {error ? (
        <p role="alert" className="field-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}
