"use client";

/** Shown when a save or a transition met a newer version of the sheet (409). */
export function ConflictBanner({ onReload }: { onReload: () => void }) {
  return (
    <div role="alert" className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-signal-500/50 bg-signal-50 px-4 py-3 text-sm text-signal-700">
      <div>
        <p className="font-semibold">Not saved: someone else saved this sheet first.</p>
        <p>Your edits stay in the form until you reload. Reloading shows their version and drops your unsaved edits.</p>
      </div>
      <button type="button" className="btn-danger" onClick={onReload}>
        Reload
      </button>
    </div>
  );
}
