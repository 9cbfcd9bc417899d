import Link from "next/link";
import { Fragment } from "react";

/** One step of the trail: a link when it has an href; the last step is the current page. */
export interface Crumb {
  label: string;
  href?: string;
  /** Codes and tags are set in the monospace face. */
  mono?: boolean;
}

export function Breadcrumbs({ items }: { items: readonly Crumb[] }) {
  return (
    <nav aria-label="Breadcrumb" className="mb-3 text-sm text-fen-500">
      {items.map((c, i) => (
        <Fragment key={`${i}-${c.label}`}>
          {i > 0 && (
            <span aria-hidden="true" className="mx-2">
              /
            </span>
          )}
          {c.href ? (
            <Link href={c.href} className={`${c.mono ? "font-mono " : ""}hover:text-fen-800 hover:underline`}>
              {c.label}
            </Link>
          ) : (
            <span className={`${c.mono ? "font-mono " : ""}text-fen-700`}>{c.label}</span>
          )}
        </Fragment>
      ))}
    </nav>
  );
}
