"use client";

import { useId, useState } from "react";

/**
 * The one time a token's secret is visible. It lives only in this component's state:
 * leaving or reloading the page loses it for good, which the warning says.
 */
export function NewTokenNotice({ name, token, onDismiss }: { name: string; token: string; onDismiss: () => void }) {
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const id = useId();
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(token);
      setCopied("yes");
    } catch {
      setCopied("failed");
    }
  };
  return (
    <section aria-labelledby={`${id}-title`} className="rounded-md border border-amberline-500/50 bg-amberline-50 p-4">
      <h3 id={`${id}-title`} className="text-sm font-semibold text-fen-900">
        Token “{name}” created
      </h3>
      <p id={`${id}-warning`} className="mt-1 text-sm text-fen-800">
        <strong>Copy it now: it is shown only this once.</strong> Ohmstead keeps only a fingerprint of it and cannot show it again. Anyone who has it can act as you
        through the API, so store it like a password. If it is lost or exposed, revoke it and create a new one.
      </p>
      <label htmlFor={`${id}-value`} className="field-label mt-3">
        Your new API token
      </label>
      <div className="flex flex-col gap-2 sm:flex-row">
        <input
          id={`${id}-value`}
          readOnly
          value={token}
          aria-describedby={`${id}-warning`}
          className="field-input font-mono text-sm"
          onFocus={(e) => e.currentTarget.select()}
          spellCheck={false}
        />
        <button type="button" className="btn-primary shrink-0" onClick={copy}>
          {copied === "yes" ? "Copied" : "Copy token"}
        </button>
        <button type="button" className="btn-secondary shrink-0" onClick={onDismiss}>
          I have stored it
        </button>
      </div>
      <p role="status" className="mt-2 min-h-5 text-sm text-fen-700">
        {copied === "yes" ? "The token is on your clipboard." : copied === "failed" ? "Copying was blocked by the browser: select the token and copy it by hand." : ""}
      </p>
    </section>
  );
}
