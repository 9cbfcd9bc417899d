"use client";

import { useState } from "react";

/**
 * Posts to the package route, which answers with a redirect back here. Rendering many
 * sheets takes a few seconds: the button says so meanwhile.
 */
export function IssuePackageForm({ action }: { action: string }) {
  const [pending, setPending] = useState(false);
  return (
    <form method="post" action={action} onSubmit={() => setPending(true)} className="flex flex-wrap items-center gap-4">
      <label className="inline-flex items-center gap-2 text-sm text-fen-800">
        <input type="checkbox" name="includeDrafts" className="h-4 w-4 accent-copper-600" />
        Include drafts (watermarked DRAFT)
      </label>
      <button type="submit" className="btn-primary" disabled={pending} aria-busy={pending}>
        {pending ? "Generating package…" : "Issue calculation package"}
      </button>
      <p className="field-hint w-full">Every sheet&apos;s approved revision, in project order, with a cover, status table, index and basis page.</p>
    </form>
  );
}
