import { fixed, sig } from "@/lib/engine/format";

/** Drops trailing zeros after the decimal point: "12.50" → "12.5", "100.0" → "100". */
export function trimZeros(s: string): string {
  return s.includes(".") && !s.includes("e") ? s.replace(/\.?0+$/, "") : s;
}

/** n significant figures without trailing zeros: 50 → "50", 1.2 → "1.2", 0.4083 → "0.408". */
export function plain(x: number, n: number): string {
  return trimZeros(sig(x, n));
}

/** At most d decimals, trailing zeros dropped: (3.9370, 3) → "3.937", (100, 1) → "100". */
export function upTo(x: number, d: number): string {
  return trimZeros(fixed(x, d));
}

/** A current to 3 significant figures: "1600 A", "87.5 A". */
export function amps(x: number): string {
  return `${plain(x, 3)} A`;
}
