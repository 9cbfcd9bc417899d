import type { ReactNode } from "react";

/** Shown where a list has nothing to show: says why, and what to do next. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center justify-center px-6 py-12 text-center">
      <svg viewBox="0 0 40 40" className="mb-3 h-10 w-10 text-fen-300" aria-hidden="true">
        <rect x="6" y="10" width="28" height="5" rx="1.2" fill="currentColor" />
        <rect x="6" y="18" width="28" height="5" rx="1.2" fill="currentColor" opacity="0.7" />
        <rect x="6" y="26" width="28" height="5" rx="1.2" fill="currentColor" opacity="0.45" />
      </svg>
      <p className="text-sm font-semibold text-fen-800">{title}</p>
      {children && <div className="mt-1 max-w-md text-sm text-fen-600">{children}</div>}
      {action && <div className="mt-4">{action}</div>}
    </div>
  );
}
