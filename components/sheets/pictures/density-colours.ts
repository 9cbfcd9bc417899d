import { densityStops } from "./palette";

/** Linear interpolation between two #rrggbb colours, t in 0…1. */
export function mixHex(a: string, b: string, t: number): string {
  const pa = parseInt(a.slice(1), 16);
  const pb = parseInt(b.slice(1), 16);
  const ch = (shift: number) => {
    const ca = (pa >> shift) & 255;
    const cb = (pb >> shift) & 255;
    return Math.round(ca + (cb - ca) * t);
  };
  return `#${((ch(16) << 16) | (ch(8) << 8) | ch(0)).toString(16).padStart(6, "0")}`;
}

/** Colour of t in 0…1 on the density map (clamped; NaN counts as 0). */
export function densityColour(t: number): string {
  const s = densityStops;
  const k = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const pos = k * (s.length - 1);
  const i = Math.min(s.length - 2, Math.floor(pos));
  return mixHex(s[i]!, s[i + 1]!, pos - i);
}

/**
 * Position of a value in [min, max] on the colour map. A range of zero width (uniform
 * density, as at DC) maps everything to the middle of the scale.
 */
export function densityPosition(value: number, min: number, max: number): number {
  if (!(max - min > 1e-12 * Math.max(1, Math.abs(max)))) return 0.5;
  return (value - min) / (max - min);
}
