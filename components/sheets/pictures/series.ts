/**
 * Data preparation for the chart pictures: unit conversion at the edge, sorting,
 * interpolation of the design point, axis ranges. Pure functions (no React, no chart
 * library), so the sheets, the tests and the charts share them.
 */
import { fixed } from "@/lib/engine/format";
import { amps } from "./format-text";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import { displayDistance, displayTemperature, distanceUnit, temperatureUnit, type PictureUnits } from "./units";

// ---------------------------------------------------------------------------------
// Helpers
// ---------------------------------------------------------------------------------

/** y at x on the polyline through (xs, ys) sorted by x; undefined outside its range. */
export function interpolateAt(xs: readonly number[], ys: readonly number[], x: number): number | undefined {
  if (!Number.isFinite(x)) return undefined;
  for (let i = 0; i + 1 < xs.length; i++) {
    const x0 = xs[i]!;
    const x1 = xs[i + 1]!;
    if (x >= x0 && x <= x1) {
      if (x1 === x0) return ys[i + 1];
      return ys[i]! + ((ys[i + 1]! - ys[i]!) * (x - x0)) / (x1 - x0);
    }
  }
  return undefined;
}

/** First x where the polyline reaches y = target from below; undefined if it never does. */
export function firstCrossing(xs: readonly number[], ys: readonly number[], target: number): number | undefined {
  // A curve that starts at or above the target has no crossing to read off.
  if (!(ys[0]! < target)) return undefined;
  for (let i = 0; i + 1 < xs.length; i++) {
    const y0 = ys[i]!;
    const y1 = ys[i + 1]!;
    if (y0 < target && y1 >= target) return xs[i]! + ((xs[i + 1]! - xs[i]!) * (target - y0)) / (y1 - y0);
  }
  return undefined;
}

/** Step of 1, 2 or 5 × 10ⁿ giving about `count` intervals over `span`. */
export function niceStep(span: number, count = 5): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / count;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * p;
}

/** [lo, hi] covering every value, widened to whole steps; a single value gets a span around it. */
export function niceDomain(values: readonly number[], count = 5): [number, number] {
  return niceAxis(values, count).domain;
}

/** Domain widened to whole steps and the tick values on it (1, 2 or 5 × 10ⁿ apart). */
export function niceAxis(values: readonly number[], count = 5): { domain: [number, number]; ticks: number[] } {
  const v = values.filter(Number.isFinite);
  if (v.length === 0) return { domain: [0, 1], ticks: [0, 1] };
  let lo = Math.min(...v);
  let hi = Math.max(...v);
  if (hi - lo < 1e-9 * Math.max(1, Math.abs(hi))) {
    const pad = Math.max(1, Math.abs(hi) * 0.05);
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(hi - lo, count);
  const a = Math.floor(lo / step);
  const b = Math.ceil(hi / step);
  const ticks: number[] = [];
  for (let k = a; k <= b; k++) ticks.push(cleanMultiple(k, step));
  return { domain: [cleanMultiple(a, step), cleanMultiple(b, step)], ticks };
}

/** k·step without binary noise (3 × 0.1 → 0.3, not 0.30000000000000004). */
function cleanMultiple(k: number, step: number): number {
  return Number((k * step).toPrecision(12));
}

// ---------------------------------------------------------------------------------
// Temperature against current
// ---------------------------------------------------------------------------------

export interface TemperaturePointIn {
  current_A: number;
  temperature_C: number;
}

export interface TemperatureSeries {
  tempUnit: "°C" | "°F";
  /** Sorted by current; temperatures in the display unit. */
  data: { current: number; temperature: number }[];
  limit?: number;
  designCurrent?: number;
  /** The curve at the design current, when the design current lies on the curve. */
  operating?: { current: number; temperature: number; withinLimit?: boolean };
  /** Where the curve reaches the limit: the rating read off the curve. */
  rating?: { current: number; temperature: number };
  xDomain: [number, number];
  yDomain: [number, number];
  xTicks: number[];
  yTicks: number[];
}

export function toTemperatureSeries(
  points: readonly TemperaturePointIn[],
  opts: { limit_C?: number; designCurrent_A?: number; units?: PictureUnits } = {},
): TemperatureSeries {
  const units = opts.units ?? "metric";
  const data = points
    .filter((p) => Number.isFinite(p.current_A) && Number.isFinite(p.temperature_C))
    .map((p) => ({ current: p.current_A, temperature: displayTemperature(p.temperature_C, units) }))
    .sort((a, b) => a.current - b.current);
  const xs = data.map((d) => d.current);
  const ys = data.map((d) => d.temperature);
  const limit = opts.limit_C !== undefined && Number.isFinite(opts.limit_C) ? displayTemperature(opts.limit_C, units) : undefined;
  const designCurrent = opts.designCurrent_A !== undefined && Number.isFinite(opts.designCurrent_A) ? opts.designCurrent_A : undefined;

  let operating: TemperatureSeries["operating"];
  if (designCurrent !== undefined) {
    const t = interpolateAt(xs, ys, designCurrent);
    if (t !== undefined) operating = { current: designCurrent, temperature: t, withinLimit: limit === undefined ? undefined : t <= limit };
  }
  let rating: TemperatureSeries["rating"];
  if (limit !== undefined) {
    const c = firstCrossing(xs, ys, limit);
    if (c !== undefined) rating = { current: c, temperature: limit };
  }
  const x = niceAxis([0, ...xs, ...(designCurrent !== undefined ? [designCurrent] : [])], 6);
  const y = niceAxis([...ys, ...(limit !== undefined ? [limit] : [])], 6);
  return { tempUnit: temperatureUnit(units), data, limit, designCurrent, operating, rating, xDomain: x.domain, yDomain: y.domain, xTicks: x.ticks, yTicks: y.ticks };
}

// ---------------------------------------------------------------------------------
// Voltage along a feeder or path
// ---------------------------------------------------------------------------------

export interface VoltagePointIn {
  distance_m: number;
  voltage_V: number;
  label?: string;
}

export interface VoltageSeries {
  distUnit: "m" | "ft";
  /** In the order of distance; points at the same distance keep their order, so a step stays a step. */
  data: { distance: number; voltage: number; label?: string }[];
  limit?: number;
  sending?: { distance: number; voltage: number };
  receiving?: { distance: number; voltage: number };
  /** Whether the receiving end stays at or above the limit (undefined without a limit). */
  withinLimit?: boolean;
  /** Lowest voltage anywhere on the profile. */
  lowest?: { distance: number; voltage: number };
  /** From the first to the last point: the route, no empty run after it. */
  xDomain: [number, number];
  yDomain: [number, number];
  xTicks: number[];
  yTicks: number[];
}

export function toVoltageSeries(points: readonly VoltagePointIn[], opts: { limitVoltage_V?: number; units?: PictureUnits } = {}): VoltageSeries {
  const units = opts.units ?? "metric";
  const data = points
    .filter((p) => Number.isFinite(p.distance_m) && Number.isFinite(p.voltage_V))
    .map((p) => ({ distance: displayDistance(p.distance_m, units), voltage: p.voltage_V, ...(p.label ? { label: p.label } : {}) }))
    .sort((a, b) => a.distance - b.distance);
  const limit = opts.limitVoltage_V !== undefined && Number.isFinite(opts.limitVoltage_V) ? opts.limitVoltage_V : undefined;
  const sending = data[0];
  const receiving = data[data.length - 1];
  let lowest: VoltageSeries["lowest"];
  for (const d of data) if (!lowest || d.voltage < lowest.voltage) lowest = { distance: d.distance, voltage: d.voltage };
  const xs = data.map((d) => d.distance);
  const vs = data.map((d) => d.voltage);
  const x0 = Math.min(0, ...xs);
  const x1 = Math.max(0, ...xs);
  const xTicks = niceAxis([x0, x1], 6).ticks.filter((t) => t >= x0 - 1e-9 && t <= x1 + 1e-9);
  const y = niceAxis([...vs, ...(limit !== undefined ? [limit] : [])], 5);
  return {
    distUnit: distanceUnit(units),
    data,
    limit,
    sending: sending && { distance: sending.distance, voltage: sending.voltage },
    receiving: receiving && { distance: receiving.distance, voltage: receiving.voltage },
    withinLimit: limit === undefined || !lowest ? undefined : lowest.voltage >= limit,
    lowest,
    xDomain: [x0, x1 > x0 ? x1 : x0 + 1],
    yDomain: y.domain,
    xTicks,
    yTicks: y.ticks,
  };
}

// ---------------------------------------------------------------------------------
// Parallel paths
// ---------------------------------------------------------------------------------

export interface PathShareIn {
  name: string;
  current_A: number;
  /** Ampacity of the whole path (all its conductors), A. */
  ampacity_A?: number;
  /** Fraction of the total current, 0…1 (AC shares may add to more than 1 when the angles differ). */
  share: number;
}

export interface ContingencyIn {
  /** Name of the path that is open. */
  openPath: string;
  /** Current in each path with that one open, in the order of `paths` (0 for the open one). */
  currents: readonly number[];
}

export interface PathShareRow {
  name: string;
  current: number;
  share: number;
  ampacity?: number;
  /** current / ampacity when an ampacity is known. */
  utilisation?: number;
  overloaded: boolean;
  /** Current with the chosen path open. */
  contingency?: number;
  contingencyOverloaded?: boolean;
  isOpen?: boolean;
}

export function toPathShareRows(paths: readonly PathShareIn[], contingency?: ContingencyIn): PathShareRow[] {
  return paths.map((p, i) => {
    const amp = p.ampacity_A !== undefined && p.ampacity_A > 0 ? p.ampacity_A : undefined;
    const row: PathShareRow = {
      name: p.name,
      current: p.current_A,
      share: p.share,
      overloaded: amp !== undefined && p.current_A > amp,
      ...(amp !== undefined ? { ampacity: amp, utilisation: p.current_A / amp } : {}),
    };
    if (contingency) {
      const c = contingency.currents[i] ?? 0;
      row.contingency = c;
      row.isOpen = contingency.openPath === p.name;
      row.contingencyOverloaded = amp !== undefined && c > amp;
    }
    return row;
  });
}

/** Upper end of the current axis: every current, contingency current and ampacity fits. */
export function pathCurrentAxis(rows: readonly PathShareRow[]): { max: number; ticks: number[] } {
  const a = niceAxis([0, ...rows.flatMap((r) => [r.current, r.contingency ?? 0, r.ampacity ?? 0])], 5);
  return { max: a.domain[1], ticks: a.ticks };
}

/** Index of the contingency that loads some path hardest relative to its ampacity (or, without ampacities, in amperes); −1 when there is none. */
export function worstContingencyIndex(paths: readonly PathShareIn[], contingency: readonly ContingencyIn[]): number {
  const rated = paths.some((p) => p.ampacity_A !== undefined && p.ampacity_A > 0);
  let best = -1;
  let bestScore = -Infinity;
  contingency.forEach((c, k) => {
    let score = -Infinity;
    paths.forEach((p, i) => {
      const cur = c.currents[i] ?? 0;
      if (!rated) score = Math.max(score, cur);
      else if (p.ampacity_A !== undefined && p.ampacity_A > 0) score = Math.max(score, cur / p.ampacity_A);
    });
    if (score > bestScore) {
      bestScore = score;
      best = k;
    }
  });
  return best;
}

/**
 * Props for the path picture from a parallel-sharing result. The path ampacity is the
 * per-conductor ampacity times the count when the input paths are given, otherwise it is
 * read back from the utilisation (I / I_z).
 */
export function pathSharesFromParallel(
  results: Pick<ParallelSharingResults, "paths" | "contingencies">,
  inputPaths?: readonly { name: string; count?: number; ampacityPerConductor_A?: number }[],
): { paths: PathShareIn[]; contingency: ContingencyIn[] } {
  const byName = new Map((inputPaths ?? []).map((p) => [p.name.trim(), p]));
  const paths = results.paths.map((p): PathShareIn => {
    const inp = byName.get(p.name);
    let ampacity: number | undefined;
    if (inp?.ampacityPerConductor_A !== undefined) ampacity = inp.ampacityPerConductor_A * (inp.count ?? 1);
    else if (p.utilisation !== undefined && p.utilisation > 0 && p.current_A > 0) ampacity = p.current_A / p.utilisation;
    return { name: p.name, current_A: p.current_A, share: p.share_pct / 100, ...(ampacity !== undefined ? { ampacity_A: ampacity } : {}) };
  });
  const contingency = results.contingencies.map((c) => ({
    openPath: c.openPath,
    currents: results.paths.map((p) => c.paths.find((q) => q.name === p.name)?.current_A ?? 0),
  }));
  return { paths, contingency };
}

/** One remaining path when another is open: its current before and after, and against its ampacity. */
export interface RedistributionRow {
  name: string;
  before: number;
  after: number;
  /** after − before, A. */
  increase: number;
  /** after / before − 1 (undefined when the path carried nothing before). */
  increaseRatio?: number;
  ampacity?: number;
  /** after / ampacity. */
  afterUtilisation?: number;
  overloaded: boolean;
  /** The path that is open (after = 0). */
  isOpen: boolean;
}

/** Before → after for every path with one path open (the open one included, marked). */
export function redistribution(paths: readonly PathShareIn[], c: ContingencyIn): RedistributionRow[] {
  return paths.map((p, i) => {
    const after = c.currents[i] ?? 0;
    const amp = p.ampacity_A !== undefined && p.ampacity_A > 0 ? p.ampacity_A : undefined;
    const isOpen = c.openPath === p.name;
    return {
      name: p.name,
      before: p.current_A,
      after: isOpen ? 0 : after,
      increase: (isOpen ? 0 : after) - p.current_A,
      ...(p.current_A > 0 ? { increaseRatio: (isOpen ? 0 : after) / p.current_A - 1 } : {}),
      ...(amp !== undefined ? { ampacity: amp, afterUtilisation: (isOpen ? 0 : after) / amp } : {}),
      overloaded: !isOpen && amp !== undefined && after > amp,
      isOpen,
    };
  });
}

/** The case in words: which remaining paths exceed their ampacity, or that none does. */
export function redistributionSentence(openPath: string, rows: readonly RedistributionRow[]): string {
  const over = rows.filter((r) => r.overloaded);
  const rated = rows.some((r) => !r.isOpen && r.ampacity !== undefined);
  if (over.length === 0) {
    if (!rated) return `With ${openPath} open, the remaining paths share the current; no ampacity is given, so overloads are not assessed.`;
    return `With ${openPath} open, every remaining path stays within its ampacity.`;
  }
  const list = over.map((r) => `${r.name} carries ${amps(r.after)}, ${fixed((r.afterUtilisation ?? 0) * 100, 0)} % of its ${amps(r.ampacity ?? 0)} ampacity`);
  return `With ${openPath} open, ${list.join("; ")}: ${over.length === 1 ? "it is" : "they are"} overloaded.`;
}

/** One "path open" case of the N−1 table. */
export interface ContingencyCaseRow {
  openPath: string;
  /** The remaining path loaded highest against its ampacity (or in amperes, without ampacities). */
  highest?: { name: string; current: number; utilisation?: number };
  overloaded: string[];
  verdict: "pass" | "fail" | "not rated";
}

/** Every "one path open" case with its highest loaded path and verdict, and the index of the worst case. */
export function contingencyTable(paths: readonly PathShareIn[], cases: readonly ContingencyIn[]): { rows: ContingencyCaseRow[]; worst: number } {
  const rated = paths.some((p) => p.ampacity_A !== undefined && p.ampacity_A > 0);
  const rows = cases.map((c): ContingencyCaseRow => {
    const red = redistribution(paths, c).filter((r) => !r.isOpen);
    let highest: ContingencyCaseRow["highest"];
    let score = -Infinity;
    for (const r of red) {
      const s = rated ? (r.afterUtilisation ?? -Infinity) : r.after;
      if (s > score) {
        score = s;
        highest = { name: r.name, current: r.after, ...(r.afterUtilisation !== undefined ? { utilisation: r.afterUtilisation } : {}) };
      }
    }
    const overloaded = red.filter((r) => r.overloaded).map((r) => r.name);
    return { openPath: c.openPath, ...(highest ? { highest } : {}), overloaded, verdict: !rated ? "not rated" : overloaded.length ? "fail" : "pass" };
  });
  return { rows, worst: worstContingencyIndex(paths, cases) };
}

// ---------------------------------------------------------------------------------
// Text summaries (figure captions and screen readers)
// ---------------------------------------------------------------------------------

export function temperatureSummary(s: TemperatureSeries): string {
  if (s.data.length === 0) return "Temperature against current: no points to plot.";
  const last = s.data[s.data.length - 1]!;
  const parts = [`Conductor temperature against current from ${amps(s.data[0]!.current)} to ${amps(last.current)}`];
  if (s.operating) {
    const verdict = s.operating.withinLimit === undefined ? "" : s.operating.withinLimit ? ", within the limit" : ", above the limit";
    parts.push(`${fixed(s.operating.temperature, 1)} ${s.tempUnit} at the design current of ${amps(s.operating.current)}${verdict}`);
  }
  if (s.limit !== undefined) parts.push(`limit ${fixed(s.limit, 0)} ${s.tempUnit}`);
  if (s.rating) parts.push(`the curve reaches the limit at about ${amps(s.rating.current)}`);
  return `${parts.join("; ")}.`;
}

export function voltageSummary(s: VoltageSeries): string {
  if (!s.sending || !s.receiving) return "Voltage along the route: no points to plot.";
  const parts = [
    `Voltage along the route over ${fixed(s.receiving.distance - s.sending.distance, 0)} ${s.distUnit}`,
    `${fixed(s.sending.voltage, 1)} V at the start, ${fixed(s.receiving.voltage, 1)} V at the receiving end`,
  ];
  if (s.limit !== undefined) parts.push(`limit ${fixed(s.limit, 1)} V, ${s.withinLimit ? "never crossed" : "crossed"}`);
  return `${parts.join("; ")}.`;
}

export function pathSharesSummary(rows: readonly PathShareRow[], openPath?: string): string {
  if (rows.length === 0) return "Current per parallel path: no paths.";
  const list = rows.map((r) => `${r.name} ${amps(r.current)} (${fixed(r.share * 100, 0)} %${r.overloaded ? ", overloaded" : ""})`).join(", ");
  let text = `Current per parallel path: ${list}.`;
  if (openPath !== undefined && rows.some((r) => r.contingency !== undefined)) {
    const over = rows.filter((r) => r.contingencyOverloaded).map((r) => r.name);
    text += ` With ${openPath} open: ${over.length ? `${over.join(", ")} overloaded` : "no path overloaded"}.`;
  }
  return text;
}
