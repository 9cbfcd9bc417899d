/** The caution shown beside every thermal, fault-withstand and voltage-drop result. */
export const CAUTION_TEXT = "Design aid. Verify under the governing standard and local codes; a qualified engineer decides.";

export function Caution({ className = "" }: { className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      className={`flex gap-2 rounded-md border border-amberline-500/50 bg-amberline-50 px-3 py-2 text-sm text-amberline-700 ${className}`}
    >
      <svg viewBox="0 0 20 20" className="mt-0.5 h-4 w-4 shrink-0" aria-hidden="true">
        <path d="M10 2 19 18H1L10 2Z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
        <path d="M10 8v4.5M10 14.8v.4" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      </svg>
      <p>
        <strong className="font-semibold">Caution. </strong>
        {CAUTION_TEXT}
      </p>
    </aside>
  );
}
