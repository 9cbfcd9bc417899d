/** Shown while a signed-in page loads: the shape of a page header and a table. */
export default function Loading() {
  return (
    <div aria-busy="true" aria-live="polite" className="animate-pulse">
      <span className="sr-only">Loading…</span>
      <div className="mb-6 border-b border-fen-200 pb-5">
        <div className="h-3 w-24 rounded bg-copper-100" />
        <div className="mt-3 h-7 w-64 rounded bg-fen-200" />
      </div>
      <div className="panel divide-y divide-fen-100">
        {Array.from({ length: 6 }, (_, i) => (
          <div key={i} className="flex gap-4 px-4 py-3">
            <div className="h-4 w-24 rounded bg-fen-100" />
            <div className="h-4 flex-1 rounded bg-fen-100" />
            <div className="h-4 w-32 rounded bg-fen-100" />
          </div>
        ))}
      </div>
    </div>
  );
}
