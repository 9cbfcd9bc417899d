import type { ReactNode } from "react";

export type BadgeTone = "neutral" | "active" | "pass" | "fail" | "warning" | "archived";

const TONES: Record<BadgeTone, string> = {
  neutral: "bg-fen-100 text-fen-700",
  active: "bg-copper-50 text-copper-800 ring-1 ring-inset ring-copper-200",
  pass: "bg-verdigris-50 text-verdigris-700 ring-1 ring-inset ring-verdigris-100",
  fail: "bg-signal-50 text-signal-700 ring-1 ring-inset ring-signal-100",
  warning: "bg-amberline-50 text-amberline-700 ring-1 ring-inset ring-amberline-100",
  archived: "bg-fen-100 text-fen-600 ring-1 ring-inset ring-fen-200",
};

export function StatusBadge({ tone = "neutral", children }: { tone?: BadgeTone; children: ReactNode }) {
  return <span className={`badge ${TONES[tone]}`}>{children}</span>;
}

/** A project's lifecycle state. */
export function ProjectStateBadge({ archivedAt }: { archivedAt: Date | string | null }) {
  return archivedAt ? <StatusBadge tone="archived">Archived</StatusBadge> : <StatusBadge tone="pass">Active</StatusBadge>;
}
