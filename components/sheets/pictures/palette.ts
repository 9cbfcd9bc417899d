import config from "@/tailwind.config";

/**
 * The app palette as plain hex values for SVG attributes and chart props (a drawing
 * must keep its colours when it is saved, printed or rendered outside the page's CSS).
 * One source: tailwind.config.ts.
 */
const c = config.theme.extend.colors;

export const ink = {
  text: c.fen[900],
  muted: c.fen[600],
  faint: c.fen[400],
  axis: c.fen[300],
  grid: c.fen[100],
  paper: "#ffffff",
  /** Design point, the value the sheet is about. */
  accent: c.copper[600],
  accentSoft: c.copper[200],
  pass: c.verdigris[600],
  fail: c.signal[500],
  failDark: c.signal[700],
  warn: c.amberline[500],
  /** Plain (DC) bar fill and outline. */
  metal: c.copper[300],
  metalEdge: c.copper[800],
  /** Main data line of a chart. */
  series: c.fen[700],
  seriesSoft: c.fen[300],
} as const;

/**
 * Sequential colour map for current density, dark to light with rising |J| so the
 * order reads without colour vision (lightness increases monotonically along the stops).
 * Verdigris and signal are left out on purpose: they mean pass and fail elsewhere.
 */
export const densityStops: readonly string[] = [c.fen[950], c.fen[700], c.fen[500], c.copper[600], c.copper[400], c.copper[200], c.amberline[100]];
