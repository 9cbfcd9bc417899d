/**
 * Unit conversions at the edges of the engine (the engine itself works in SI).
 * Factors are the exact definitions (international yard and pound agreement, 1959:
 * 1 in = 25.4 mm, 1 ft = 0.3048 m; °F = °C·9/5 + 32); tests check them against the
 * convert-units library, which carries the foot to 6 figures only. Wire gauges follow
 * ASTM B258 (American Wire Gauge) and the definition of the circular mil.
 */

export type LengthUnit = "mm" | "cm" | "m" | "km" | "in" | "ft" | "yd" | "mi";
export const LENGTH_UNITS = ["mm", "cm", "m", "km", "in", "ft", "yd", "mi"] as const;
export type AreaUnit = "mm2" | "cm2" | "m2" | "in2";
export const AREA_UNITS = ["mm2", "cm2", "m2", "in2"] as const;
export type TempUnit = "C" | "F" | "K";
export const TEMP_UNITS = ["C", "F", "K"] as const;
export type CurrentUnit = "A" | "mA" | "kA";
export const CURRENT_UNITS = ["A", "mA", "kA"] as const;

const METRES: Record<LengthUnit, number> = { mm: 1e-3, cm: 1e-2, m: 1, km: 1e3, in: 0.0254, ft: 0.3048, yd: 0.9144, mi: 1609.344 };
const SQUARE_METRES: Record<AreaUnit, number> = { mm2: 1e-6, cm2: 1e-4, m2: 1, in2: 0.0254 * 0.0254 };
const AMPERES: Record<CurrentUnit, number> = { A: 1, mA: 1e-3, kA: 1e3 };

function factor<U extends string>(table: Record<U, number>, unit: U, kind: string): number {
  const f = table[unit];
  if (f === undefined) throw new RangeError(`${kind} unit must be one of: ${Object.keys(table).join(", ")}; got "${unit}"`);
  return f;
}

export function lengthToM(value: number, unit: LengthUnit): number {
  return value * factor(METRES, unit, "length");
}
export function mToLength(value_m: number, unit: LengthUnit): number {
  return value_m / factor(METRES, unit, "length");
}
export function areaToM2(value: number, unit: AreaUnit): number {
  return value * factor(SQUARE_METRES, unit, "area");
}
export function m2ToArea(value_m2: number, unit: AreaUnit): number {
  return value_m2 / factor(SQUARE_METRES, unit, "area");
}
export function tempToC(value: number, unit: TempUnit): number {
  if (unit === "C") return value;
  if (unit === "F") return ((value - 32) * 5) / 9;
  if (unit === "K") return value - 273.15;
  throw new RangeError(`temperature unit must be one of: C, F, K; got "${String(unit)}"`);
}
export function cToTemp(value_C: number, unit: TempUnit): number {
  if (unit === "C") return value_C;
  if (unit === "F") return (value_C * 9) / 5 + 32;
  if (unit === "K") return value_C + 273.15;
  throw new RangeError(`temperature unit must be one of: C, F, K; got "${String(unit)}"`);
}
export function currentToA(value: number, unit: CurrentUnit): number {
  return value * factor(AMPERES, unit, "current");
}
export function aToCurrent(value_A: number, unit: CurrentUnit): number {
  return value_A / factor(AMPERES, unit, "current");
}

// ---------------------------------------------------------------------------------
// American Wire Gauge and kcmil
// ---------------------------------------------------------------------------------

/** AWG designations from 40 to 4/0, thinnest first. */
export const AWG_SIZES = [
  "40", "39", "38", "37", "36", "35", "34", "33", "32", "31", "30", "29", "28", "27", "26", "25", "24", "23", "22", "21",
  "20", "19", "18", "17", "16", "15", "14", "13", "12", "11", "10", "9", "8", "7", "6", "5", "4", "3", "2", "1",
  "1/0", "2/0", "3/0", "4/0",
] as const;
export type AwgSize = (typeof AWG_SIZES)[number];

/** Gauge number n of an AWG designation: "1/0" → 0, "2/0" → −1, "3/0" → −2, "4/0" → −3 (ASTM B258 §4). */
export function awgNumber(awg: string): number {
  const t = awg.trim().toUpperCase().replace(/\s*AWG$/, "");
  const aught = /^([1-4])\/0$/.exec(t) ?? /^(0{1,4})$/.exec(t);
  if (aught) return aught[1]!.startsWith("0") ? 1 - aught[1]!.length : 1 - Number(aught[1]);
  if (/^\d{1,2}$/.test(t)) {
    const n = Number(t);
    if (n >= 1 && n <= 40) return n;
  }
  throw new RangeError(`AWG size must be one of 40…1, 1/0, 2/0, 3/0, 4/0; got "${awg}"`);
}

/** Designation of gauge number n: 0 → "1/0", −3 → "4/0". */
export function awgName(n: number): string {
  if (n <= 0) return `${1 - n}/0`;
  return String(n);
}

/** Diameter of a solid AWG wire, m: d = 0.127 mm × 92^((36 − n)/39) — ASTM B258-18 §4 (eq. 1). */
export function awgDiameter_m(awg: string): number {
  const n = awgNumber(awg);
  return 0.127e-3 * Math.pow(92, (36 - n) / 39);
}

/** Cross-section of an AWG size, m² (π·d²/4 of the ASTM B258 diameter). */
export function awgToArea_m2(awg: string): number {
  const d = awgDiameter_m(awg);
  return (Math.PI * d * d) / 4;
}

/** 1 circular mil = π/4 × (0.0254 mm)² = 5.067 075e-4 mm² (definition of the circular mil); 1 kcmil = 0.506 707 mm². */
export const KCMIL_MM2 = (Math.PI / 4) * 0.0254 * 0.0254 * 1000;

export function kcmilToArea_m2(kcmil: number): number {
  if (!(kcmil > 0) || !Number.isFinite(kcmil)) throw new RangeError(`kcmil must be a positive number, got ${kcmil}`);
  return kcmil * KCMIL_MM2 * 1e-6;
}

export function areaToKcmil(area_m2: number): number {
  return (area_m2 * 1e6) / KCMIL_MM2;
}

/**
 * Nearest AWG size to a cross-section (compared on a log scale, as the gauge is
 * geometric), or undefined when the area is above 4/0 by more than half a gauge step
 * (then the kcmil series applies) or below 40 AWG by as much.
 */
export function areaToNearestAwg(area_m2: number): string | undefined {
  if (!(area_m2 > 0)) return undefined;
  // area ∝ 92^(2(36 − n)/39) → n = 36 − 39·log92(d/0.127 mm)
  const d = Math.sqrt((4 * area_m2) / Math.PI);
  const nExact = 36 - 39 * (Math.log(d / 0.127e-3) / Math.log(92));
  const n = Math.round(nExact);
  if (n < -3 || n > 40) return undefined;
  return awgName(n);
}

/**
 * A conductor size written the trade's way: "4/0", "10 AWG", "250 kcmil", "250 MCM",
 * "95 mm2", "95mm²". Returns the cross-section in m².
 */
export function parseConductorSize(text: string): number {
  const t = text.trim().toLowerCase().replace(/²/g, "2");
  let m = /^([\d.]+)\s*(kcmil|mcm)$/.exec(t);
  if (m) return kcmilToArea_m2(Number(m[1]));
  m = /^([\d.]+)\s*(mm2|sq\s*mm)$/.exec(t);
  if (m) return areaToM2(Number(m[1]), "mm2");
  m = /^(\d{1,2}|[1-4]\/0|0{1,4})\s*(awg)?$/.exec(t);
  if (m) return awgToArea_m2(m[1]!);
  throw new RangeError(`conductor size "${text}" not understood; write e.g. "95 mm2", "10 AWG", "4/0" or "250 kcmil"`);
}
