"use client";

import { useState, useTransition } from "react";
import { revokeTokenAction } from "./actions";

export function RevokeTokenButton({ tokenId, name }: { tokenId: number; name: string }) {
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const revoke = () => {
    if (!window.confirm(`Revoke the token “${name}”? Programs using it will be refused at once. This cannot be undone.`)) return;
    setError(null);
    startTransition(async () => {
      const res = await revokeTokenAction({ tokenId }).catch(() => null);
      if (!res) setError("The server could not be reached. Try again.");
      else if (!res.ok) setError(res.error.message);
    });
  };
  return (
    <div>
      <button type="button" className="btn-danger py-1.5" disabled={pending} onClick={revoke} aria-label={`Revoke the token ${name}`}>
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
