/**
 * Standard conductor sizes and flat bar sizes, with typed accessors over
 * reference-tables/conductor-sizes.json and reference-tables/flat-bars.json.
 */
import sizes from "../../reference-tables/conductor-sizes.json";
import bars from "../../reference-tables/flat-bars.json";
import type { Metal } from "./materials";

export type Iec60228Class = 1 | 2 | 5;
export const IEC60228_CLASSES = [1, 2, 5] as const;

type ClassTable = { copper?: Record<string, number>; aluminium?: Record<string, number>; confidence: string };
const IEC = sizes.iec60228.classes as unknown as Record<"1" | "2" | "5", ClassTable>;

export const CONDUCTOR_SIZES_SOURCE: string = sizes.source;

/** Metric nominal cross-sections tabulated in IEC 60228 (any class or metal), mm², ascending. */
export function standardMetricSizes(): number[] {
  const set = new Set<number>();
  for (const c of Object.values(IEC)) for (const metal of ["copper", "aluminium"] as const) for (const k of Object.keys(c[metal] ?? {})) set.add(Number(k));
  return [...set].sort((a, b) => a - b);
}

/** Nominal sizes, mm², tabulated for one class and metal. */
export function iec60228Sizes(cls: Iec60228Class, metal: Metal): number[] {
  return Object.keys(IEC[String(cls) as "1" | "2" | "5"][metal] ?? {})
    .map(Number)
    .sort((a, b) => a - b);
}

export interface Iec60228Entry {
  /** Maximum DC resistance at 20 °C, Ω/m. */
  maxResistance20_ohm_m: number;
  source: string;
}

/**
 * Maximum DC resistance at 20 °C of a plain conductor of nominal size `area_mm2` (IEC
 * 60228:2004 Tables 1–3), Ω/m; undefined when the size is not tabulated for that class
 * and metal. Sizes match within 0.1 %.
 */
export function iec60228MaxResistance(area_mm2: number, cls: Iec60228Class, metal: Metal): Iec60228Entry | undefined {
  const table = IEC[String(cls) as "1" | "2" | "5"];
  const row = table?.[metal];
  if (!row) return undefined;
  for (const [k, v] of Object.entries(row)) {
    if (Math.abs(Number(k) - area_mm2) <= 1e-3 * area_mm2) return { maxResistance20_ohm_m: v / 1000, source: `IEC 60228:2004 Table ${cls === 1 ? 1 : cls === 2 ? 2 : 3}, ${k} mm² ${metal} (${table.confidence})` };
  }
  return undefined;
}

export interface UsSizeEntry {
  /** "14", "4/0", "250 kcmil". */
  size: string;
  area_m2: number;
  /** NEC Chapter 9 Table 8 DC resistance at 75 °C, Ω/m (from memory — see the table file). */
  nec75_ohm_m: { copperSolid?: number; copperStranded?: number; aluminiumStranded?: number };
}

const KFT_M = 304.8;

function usEntry(e: { size: string; area_mm2: number; nec75_ohm_per_kft: Record<string, number | undefined> }): UsSizeEntry {
  const r = e.nec75_ohm_per_kft;
  const per = (v: number | undefined) => (v === undefined ? undefined : v / KFT_M);
  const out: UsSizeEntry["nec75_ohm_m"] = {};
  const cs = per(r.copper_solid), ct = per(r.copper_stranded), at = per(r.aluminium_stranded);
  if (cs !== undefined) out.copperSolid = cs;
  if (ct !== undefined) out.copperStranded = ct;
  if (at !== undefined) out.aluminiumStranded = at;
  return { size: e.size, area_m2: e.area_mm2 * 1e-6, nec75_ohm_m: out };
}

/** AWG 14…4/0 and kcmil 250…1000 with ASTM B258 areas and NEC Table 8 resistance. */
export function usConductorSizes(): UsSizeEntry[] {
  return [...sizes.awg.sizes, ...sizes.kcmil.sizes].map(usEntry);
}

export function usConductorSize(size: string): UsSizeEntry | undefined {
  const t = size.trim().toLowerCase().replace(/\s*(awg|mcm)$/, (m) => (m.includes("mcm") ? " kcmil" : ""));
  return usConductorSizes().find((e) => e.size.toLowerCase() === t);
}

export interface FlatBarSize {
  name: string;
  width_m: number;
  thickness_m: number;
  series: "metric" | "inch";
}

export const FLAT_BARS_SOURCE: string = bars.source;

export function flatBarSizes(series?: "metric" | "inch"): FlatBarSize[] {
  const metric = bars.metric.map((b) => ({ name: b.name, width_m: b.width_mm / 1000, thickness_m: b.thickness_mm / 1000, series: "metric" as const }));
  const inch = bars.inch.map((b) => ({ name: b.name, width_m: b.width_mm / 1000, thickness_m: b.thickness_mm / 1000, series: "inch" as const }));
  return series === "metric" ? metric : series === "inch" ? inch : [...metric, ...inch];
}
