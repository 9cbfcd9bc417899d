import type { RevisionScheme } from "@/db/schema";

/** Revision label for a 0-based ordinal: A, B … Z, AA, AB … (letter) or 0, 1, 2 … (number). */
export function revisionLabel(ordinal: number, scheme: RevisionScheme): string {
  if (scheme === "number") return String(ordinal);
  let n = ordinal;
  let out = "";
  do {
    out = String.fromCharCode(65 + (n % 26)) + out;
    n = Math.floor(n / 26) - 1;
  } while (n >= 0);
  return out;
}
