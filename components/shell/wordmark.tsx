/**
 * Ohmstead's mark: a pitched roof over three laminated busbars in cross-section,
 * the homestead that holds the current. Drawn here so it scales with the text.
 */
export function OhmsteadMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 28 28" className={className} aria-hidden="true" focusable="false">
      <path d="M3.5 12.5 14 4l10.5 8.5" fill="none" stroke="#e9a77c" strokeWidth="2.4" strokeLinecap="round" strokeLinejoin="round" />
      <rect x="7.5" y="13" width="13" height="3.2" rx="0.7" fill="#df7f4c" />
      <rect x="7.5" y="17.6" width="13" height="3.2" rx="0.7" fill="#d6622b" />
      <rect x="7.5" y="22.2" width="13" height="3.2" rx="0.7" fill="#c24d21" />
    </svg>
  );
}

export function Wordmark({ tone = "light" }: { tone?: "light" | "dark" }) {
  return (
    <span className="inline-flex items-center gap-2">
      <OhmsteadMark />
      <span className={`text-lg font-semibold tracking-tight ${tone === "light" ? "text-white" : "text-fen-900"}`}>Ohmstead</span>
    </span>
  );
}
