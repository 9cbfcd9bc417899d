"use client";

import { useState, useTransition } from "react";

type Outcome = { ok: true } | { ok: false; error: { message: string } };

/**
 * A button that asks for confirmation, runs a server action and shows its refusal
 * beside the button (or that the server could not be reached).
 */
export function ConfirmActionButton({
  confirm,
  run,
  label,
  pendingLabel,
  ariaLabel,
  className = "btn-secondary py-1.5",
}: {
  confirm: string;
  run: () => Promise<Outcome>;
  label: string;
  pendingLabel: string;
  ariaLabel: string;
  className?: string;
}) {
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const onClick = () => {
    if (!window.confirm(confirm)) return;
    setError(null);
    startTransition(async () => {
      const res = await run().catch(() => null);
      if (!res) setError("The server could not be reached. Try again.");
      else if (!res.ok) setError(res.error.message);
    });
  };
  return (
    <div>
      <button type="button" className={className} disabled={pending} onClick={onClick} aria-label={ariaLabel}>
        {pending ? pendingLabel : label}
      </button>
      {error ? (
        <p role="alert" className="field-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}
