import type { ReactNode } from "react";

/**
 * The frame every chart picture shares: a figure whose caption states the result in
 * words (read by screen readers and printed with the sheet), the chart above it.
 */
export function ChartFrame({ caption, children, legend, controls }: { caption: string; children: ReactNode; legend?: ReactNode; controls?: ReactNode }) {
  return (
    <figure className="w-full min-w-0">
      {controls && <div className="mb-2 flex flex-wrap items-end gap-3">{controls}</div>}
      <div className="w-full min-w-0">{children}</div>
      {legend && <div className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-fen-600">{legend}</div>}
      <figcaption className="mt-2 text-xs text-fen-600">{caption}</figcaption>
    </figure>
  );
}

/** Space held for a chart while its code loads, the same height so the page does not jump. */
export function ChartPlaceholder({ height }: { height: number }) {
  return (
    <div style={{ height }} className="flex w-full items-center justify-center rounded-md border border-dashed border-fen-200 bg-fen-50 text-xs text-fen-500">
      Drawing chart…
    </div>
  );
}

/** A swatch and its words, for the legends under the charts. */
export function LegendKey({ colour, label, shape = "box" }: { colour: string; label: string; shape?: "box" | "line" | "dash" | "tick" }) {
  const style =
    shape === "box"
      ? { background: colour, width: 12, height: 10 }
      : shape === "tick"
        ? { background: colour, width: 3, height: 12 }
        : { borderTop: `2px ${shape === "dash" ? "dashed" : "solid"} ${colour}`, width: 18, height: 0 };
  return (
    <span className="inline-flex items-center gap-1.5">
      <span aria-hidden="true" style={style} className="inline-block" />
      {label}
    </span>
  );
}
