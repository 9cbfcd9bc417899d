import type { ReactNode } from "react";

/** A page's title row: optional eyebrow (e.g. the project code), heading, description and actions. */
export function PageHeader({ eyebrow, title, description, actions }: { eyebrow?: ReactNode; title: ReactNode; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-col gap-4 border-b border-fen-200 pb-5 sm:flex-row sm:items-end sm:justify-between">
      <div className="min-w-0">
        {eyebrow && <div className="mb-1 font-mono text-xs font-semibold uppercase tracking-wider text-copper-700">{eyebrow}</div>}
        <h1 className="text-2xl font-semibold tracking-tight text-fen-950">{title}</h1>
        {description && <div className="mt-1 max-w-3xl text-sm text-fen-600">{description}</div>}
      </div>
      {actions && <div className="flex shrink-0 flex-wrap items-center gap-2">{actions}</div>}
    </div>
  );
}
