/**
 * Geometry of a busbar arrangement, shared by the AC (filament) method, the heat
 * balance and the mechanical checks. All lengths in metres.
 *
 * Bars of one phase are a "pack": `barsPerPhase` bars side by side, thickness faces
 * towards each other, separated by a clear `gap_m`. Phase packs stand in a row along
 * the thickness direction, `phaseSpacing_m` apart centre to centre.
 *
 *   orientation "edge": the bar's width (the larger dimension) is vertical —
 *   bars "on edge", faces vertical (the usual riser/horizontal main bus layout).
 *   orientation "flat": the width is horizontal — bars lying flat, faces up and down.
 */
export type BarOrientation = "edge" | "flat";
export const BAR_ORIENTATIONS = ["edge", "flat"] as const;

export interface BarArrangement {
  /** Larger cross-section dimension of one bar. */
  barWidth_m: number;
  /** Smaller cross-section dimension of one bar. */
  barThickness_m: number;
  /** Bars in parallel per phase (1–8). */
  barsPerPhase: number;
  /** Clear gap between neighbouring bars of one phase (usually equal to the thickness). */
  gap_m: number;
  /** Number of phase packs: 1 (isolated pack), 2 (go and return), 3 (three-phase). */
  phases: 1 | 2 | 3;
  /** Centre-to-centre distance between neighbouring phase packs (ignored when phases = 1). */
  phaseSpacing_m: number;
  orientation: BarOrientation;
}

/** Cross-section of one phase (all its bars), m². */
export function phaseArea(a: BarArrangement): number {
  return a.barWidth_m * a.barThickness_m * a.barsPerPhase;
}

/** Overall thickness of one phase pack across its bars and gaps, m. */
export function packThickness(a: BarArrangement): number {
  return a.barsPerPhase * a.barThickness_m + (a.barsPerPhase - 1) * a.gap_m;
}

/**
 * Centre coordinates of every bar, (x across the thickness, y along the width), with
 * the phase index; x of phase k's pack centre is k·phaseSpacing_m.
 */
export function barCentres(a: BarArrangement): { phase: number; bar: number; x: number; y: number }[] {
  const out: { phase: number; bar: number; x: number; y: number }[] = [];
  const pitch = a.barThickness_m + a.gap_m;
  const first = -((a.barsPerPhase - 1) * pitch) / 2;
  for (let p = 0; p < a.phases; p++) {
    for (let b = 0; b < a.barsPerPhase; b++) out.push({ phase: p, bar: b, x: p * a.phaseSpacing_m + first + b * pitch, y: 0 });
  }
  return out;
}
