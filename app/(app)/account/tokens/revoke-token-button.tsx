"use client";

import { ConfirmActionButton } from "@/components/forms/confirm-action-button";
import { revokeTokenAction } from "./actions";

export function RevokeTokenButton({ tokenId, name }: { tokenId: number; name: string }) {
  return (
    <ConfirmActionButton
      confirm={`Revoke the token “${name}”? Programs using it will be refused at once. This cannot be undone.`}
      run={() => revokeTokenAction({ tokenId })}
      label="Revoke"
      pendingLabel="Revoking…"
      ariaLabel={`Revoke the token ${name}`}
      className="btn-danger py-1.5"
    />
  );
}
