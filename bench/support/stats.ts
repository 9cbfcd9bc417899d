// Small helpers for printing benchmark figures.
import os from "node:os";

/** The q-quantile (0..1) of the values, nearest rank. */
export function quantile(values: readonly number[], q: number): number {
  if (!values.length) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[rank]!;
}

/** Right-aligned table rows, the first row being the header. */
export function table(rows: readonly (readonly string[])[]): string {
  const widths = rows[0]!.map((_, i) => Math.max(...rows.map((r) => (r[i] ?? "").length)));
  return rows.map((r) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  ")).join("\n");
}

/** Load averages: the figures of a shared machine are only as good as its load. */
export function loadLine(): string {
  const [l1, l5, l15] = os.loadavg();
  return `load average ${l1!.toFixed(2)} / ${l5!.toFixed(2)} / ${l15!.toFixed(2)} (1/5/15 min) on ${os.cpus().length} cores`;
}
