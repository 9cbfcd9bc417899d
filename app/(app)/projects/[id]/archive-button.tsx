"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useSWRConfig } from "swr";
import { setProjectArchivedAction } from "../actions";
import { isProjectListKey } from "../list-key";

/** Archive (with a confirmation step) or restore a project. */
export function ArchiveButton({ id, code, archived }: { id: number; code: string; archived: boolean }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [confirming, setConfirming] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function run(next: boolean) {
    setBusy(true);
    setError(null);
    const result = await setProjectArchivedAction({ id, archived: next });
    setBusy(false);
    setConfirming(false);
    if (!result.ok) {
      setError(result.error.message);
      return;
    }
    await mutate(isProjectListKey);
    router.refresh();
  }

  if (archived) {
    return (
      <span className="inline-flex flex-col items-end gap-1">
        <button type="button" className="btn-secondary" disabled={busy} onClick={() => void run(false)}>
          {busy ? "Restoring…" : "Restore project"}
        </button>
        {error && <span role="alert" className="text-xs text-signal-700">{error}</span>}
      </span>
    );
  }
  if (confirming) {
    return (
      <span role="group" aria-label={`Confirm archiving ${code}`} className="inline-flex flex-wrap items-center gap-2 rounded-md border border-signal-100 bg-signal-50 px-3 py-1.5">
        <span className="text-sm text-signal-700">Archive {code}? It leaves the project list; it can be restored.</span>
        <button type="button" className="btn-danger" disabled={busy} onClick={() => void run(true)}>
          {busy ? "Archiving…" : "Archive"}
        </button>
        <button type="button" className="btn-secondary" disabled={busy} onClick={() => setConfirming(false)}>
          Cancel
        </button>
        {error && <span role="alert" className="w-full text-xs text-signal-700">{error}</span>}
      </span>
    );
  }
  return (
    <button type="button" className="btn-secondary" onClick={() => setConfirming(true)}>
      Archive project
    </button>
  );
}
