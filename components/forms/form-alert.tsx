import type { ReactNode } from "react";

const TONES = {
  error: "border-signal-500/40 bg-signal-50 text-signal-700",
  success: "border-verdigris-500/40 bg-verdigris-50 text-verdigris-700",
  info: "border-fen-200 bg-fen-50 text-fen-800",
} as const;

/** A message about the whole form. Errors are announced at once; other tones politely. */
export function FormAlert({ tone = "error", children }: { tone?: keyof typeof TONES; children: ReactNode }) {
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded-md border px-3 py-2 text-sm ${TONES[tone]}`}>
      {children}
    </div>
  );
}
