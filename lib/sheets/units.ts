/**
 * Units of the sheet forms. The engine takes SI (m, m², °C, A, Ω/m); a form shows its
 * numbers in the project's unit system (metric or imperial). This module says which
 * input path is which quantity, and converts between the two at the edge only:
 * form strings → engine inputs (toEngineInputs) and stored inputs → form strings
 * (toFormValues). It also rewrites the engine's range messages into the user's units.
 */
import type { UnitSystem } from "@/db/schema/projects";
import { areaToKcmil, cToTemp, kcmilToArea_m2, lengthToM, mToLength, parseConductorSize, tempToC } from "@/lib/engine/units";

export type { UnitSystem };

/** The quantities a sheet form converts; everything else (V, Hz, %, s, kA, W, N …) is shown as the engine takes it. */
export type QuantityKind = "length-small" | "length" | "area" | "area-mm2" | "temperature" | "current" | "reactance";

interface DisplayUnit {
  label: string;
  /** SI unit symbol as the engine writes it in its messages. */
  si: string;
  toSI: (v: number) => number;
  fromSI: (v: number) => number;
}

const same = (label: string): DisplayUnit => ({ label, si: label, toSI: (v) => v, fromSI: (v) => v });

const UNITS: Record<QuantityKind, Record<UnitSystem, DisplayUnit>> = {
  "length-small": {
    metric: { label: "mm", si: "m", toSI: (v) => lengthToM(v, "mm"), fromSI: (v) => mToLength(v, "mm") },
    imperial: { label: "in", si: "m", toSI: (v) => lengthToM(v, "in"), fromSI: (v) => mToLength(v, "in") },
  },
  length: {
    metric: { label: "m", si: "m", toSI: (v) => v, fromSI: (v) => v },
    imperial: { label: "ft", si: "m", toSI: (v) => lengthToM(v, "ft"), fromSI: (v) => mToLength(v, "ft") },
  },
  area: {
    metric: { label: "mm²", si: "m²", toSI: (v) => v * 1e-6, fromSI: (v) => v * 1e6 },
    imperial: { label: "kcmil", si: "m²", toSI: (v) => kcmilToArea_m2(v), fromSI: (v) => areaToKcmil(v) },
  },
  // A section the engine takes in mm² (fault withstand).
  "area-mm2": {
    metric: same("mm²"),
    imperial: { label: "kcmil", si: "mm²", toSI: (v) => kcmilToArea_m2(v) * 1e6, fromSI: (v) => areaToKcmil(v * 1e-6) },
  },
  temperature: {
    metric: same("°C"),
    imperial: { label: "°F", si: "°C", toSI: (v) => tempToC(v, "F"), fromSI: (v) => cToTemp(v, "F") },
  },
  current: { metric: same("A"), imperial: same("A") },
  // Ω/m is awkward to type: mΩ/m (metric) and Ω per 1000 ft (imperial, the trade's table unit).
  reactance: {
    metric: { label: "mΩ/m", si: "Ω/m", toSI: (v) => v * 1e-3, fromSI: (v) => v * 1e3 },
    imperial: { label: "Ω/kft", si: "Ω/m", toSI: (v) => v / (1000 * 0.3048), fromSI: (v) => v * 1000 * 0.3048 },
  },
};

/** Per calculation kind: input path (array indices written as "*") → quantity. */
export const FIELD_QUANTITIES: Record<string, Record<string, QuantityKind>> = {
  "busbar-rating": {
    "arrangement.barWidth_m": "length-small",
    "arrangement.barThickness_m": "length-small",
    "arrangement.gap_m": "length-small",
    "arrangement.phaseSpacing_m": "length-small",
    ambient_C: "temperature",
    altitude_m: "length",
    current_A: "current",
    maxTemperature_C: "temperature",
  },
  "busbar-sizing": {
    current_A: "current",
    ambient_C: "temperature",
    altitude_m: "length",
    phaseClearance_m: "length-small",
    maxTemperature_C: "temperature",
    "voltageDrop.length_m": "length",
    "fault.current_A": "current",
    "fault.initialTemperature_C": "temperature",
    "fault.finalTemperature_C": "temperature",
  },
  "voltage-drop": {
    current_A: "current",
    length_m: "length",
    area_m2: "area",
    reactance_ohm_per_m: "reactance",
    ambient_C: "temperature",
    ampacity_A: "current",
    conductorTemperature_C: "temperature",
  },
  "fault-withstand": {
    "conductor.arrangement.barWidth_m": "length-small",
    "conductor.arrangement.barThickness_m": "length-small",
    "conductor.arrangement.gap_m": "length-small",
    "conductor.arrangement.phaseSpacing_m": "length-small",
    "conductor.section_mm2": "area-mm2",
    thetaInitial_C: "temperature",
    thetaFinal_C: "temperature",
    span_m: "length",
    spacerDistance_m: "length",
  },
  "enclosure-heat": {
    width_m: "length-small",
    height_m: "length-small",
    depth_m: "length-small",
    ambient_C: "temperature",
    targetInternal_C: "temperature",
    ratedCurrent_A: "current",
  },
  "parallel-sharing": {
    current_A: "current",
    ambient_C: "temperature",
    maxTemperature_C: "temperature",
    "paths.*.area_m2": "area",
    "paths.*.length_m": "length",
    "paths.*.conductorTemperature_C": "temperature",
    "paths.*.reactance_ohm_per_m": "reactance",
    "paths.*.ampacityPerConductor_A": "current",
    "paths.*.maxTemperature_C": "temperature",
  },
  "bus-network": {
    ambient_C: "temperature",
    maxTemperature_C: "temperature",
    "conductors.*.area_m2": "area",
    "conductors.*.conductorTemperature_C": "temperature",
    "conductors.*.reactance_ohm_per_m": "reactance",
    "conductors.*.ampacity_A": "current",
    "conductors.*.maxTemperature_C": "temperature",
    "segments.*.length_m": "length",
    "segments.*.reactance_ohm_per_m": "reactance",
    "loads.*.current_A": "current",
  },
};

/** Paths whose values are text even when they look like numbers (names, tags, tempers). */
const TEXT_PATHS = new Set([
  "temperId",
  "losses.*.name",
  "losses.*.sourceSheet",
  "paths.*.name",
  "paths.*.temperId",
  // bus network ids and node names ("1" is a name, not a number)
  "nodes.*.id",
  "conductors.*.id",
  "conductors.*.temperId",
  "segments.*.id",
  "segments.*.from",
  "segments.*.to",
  "segments.*.conductor",
  "supplies.*.node",
  "loads.*.node",
  // an organisation ampacity table snapshot on a feeder sheet (codes such as "1" or "E")
  "ampacityFromTable.installation",
  "ampacityFromTable.table.name",
  "ampacityFromTable.table.source",
  "ampacityFromTable.table.rows.*.label",
  "ampacityFromTable.table.rows.*.installation",
]);

/** "losses.3.name" → "losses.*.name". */
export function pathPattern(path: string): string {
  return path.replace(/\.\d+(?=\.|$)/g, ".*");
}

export function quantityOf(kind: string, path: string): QuantityKind | undefined {
  return FIELD_QUANTITIES[kind]?.[pathPattern(path)];
}

export function displayUnit(q: QuantityKind, system: UnitSystem): DisplayUnit {
  return UNITS[q][system];
}

/** The unit label a field shows (empty when the field is not a converted quantity). */
export function unitLabel(kind: string, path: string, system: UnitSystem): string {
  const q = quantityOf(kind, path);
  return q ? UNITS[q][system].label : "";
}

const NUMERIC = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** A display number as a tidy string: 10 significant figures, no float noise ("100", "0.25"). */
export function tidyNumber(x: number): string {
  if (!Number.isFinite(x)) return "";
  return String(Number(x.toPrecision(10)));
}

/**
 * SI value of a displayed number, to 9 significant figures: the display keeps 10, so a
 * value shown and saved again comes back to the very number stored (no drift between
 * revisions from unit conversions alone).
 */
function toSIRounded(u: DisplayUnit, n: number): number {
  if (u.label === u.si) return n;
  const v = u.toSI(n);
  return Number.isFinite(v) && v !== 0 ? Number(v.toPrecision(9)) : v;
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** One form leaf → engine value: numbers converted to SI, empty → absent, unreadable text kept (the schema names it). */
function leafToEngine(kind: string, path: string, v: unknown, system: UnitSystem): unknown {
  if (typeof v !== "string") return v;
  const t = v.trim();
  if (TEXT_PATHS.has(pathPattern(path))) return t === "" ? undefined : t;
  if (t === "") return undefined;
  const q = quantityOf(kind, path);
  const compact = t.replace(/\s+/g, "");
  if (NUMERIC.test(compact)) {
    const n = Number(compact);
    return q ? toSIRounded(UNITS[q][system], n) : n;
  }
  // Imperial conductor sizes may be typed the trade's way ("4/0", "2 AWG", "250 kcmil").
  if (q === "area") {
    try {
      return system === "imperial" ? parseConductorSize(t) : parseConductorSize(/mm/i.test(t) ? t : `${t} mm2`);
    } catch {
      return t;
    }
  }
  return t;
}

/**
 * Maps every leaf. With `dropEmpty`, an object left without any value (an optional
 * group such as the voltage-drop limit of a busbar sizing, all blank) becomes absent;
 * array rows stay (a blank row is reported field by field).
 */
function walk(value: unknown, path: string, leaf: (path: string, v: unknown) => unknown, dropEmpty = false): unknown {
  if (Array.isArray(value)) return value.map((x, i) => walk(x, path ? `${path}.${i}` : String(i), leaf, false));
  if (isPlainObject(value)) {
    const out: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(value)) {
      const r = walk(x, path ? `${path}.${k}` : k, leaf, dropEmpty);
      if (r !== undefined) out[k] = r;
    }
    return dropEmpty && path !== "" && Object.keys(out).length === 0 ? undefined : out;
  }
  return leaf(path, value);
}

/** Form values (strings in the display units) → engine inputs (SI numbers). */
export function toEngineInputs(kind: string, values: Record<string, unknown>, system: UnitSystem): Record<string, unknown> {
  return walk(values, "", (p, v) => leafToEngine(kind, p, v, system), true) as Record<string, unknown>;
}

/** Stored engine inputs (SI) → form values (strings in the display units). */
export function toFormValues(kind: string, inputs: Record<string, unknown>, system: UnitSystem): Record<string, unknown> {
  return walk(inputs, "", (p, v) => {
    if (typeof v === "number") {
      const q = quantityOf(kind, p);
      return tidyNumber(q ? UNITS[q][system].fromSI(v) : v);
    }
    return v;
  }) as Record<string, unknown>;
}

const NUM_RE = "[-+]?\\d+(?:\\.\\d+)?(?:e[-+]?\\d+)?";
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/**
 * An engine message in the user's units. The engine's range messages end in
 * "from <min> to <max> <SI unit>" or "greater than <min> and up to <max> <SI unit>";
 * temperatures also appear as "(<n> °C)". Those numbers are converted; the rest stays.
 */
export function localiseMessage(kind: string, path: string, message: string, system: UnitSystem): string {
  const q = quantityOf(kind, path);
  if (!q) return message;
  const u = UNITS[q][system];
  if (u.label === u.si) return message;
  const show = (s: string) => tidyNumber(Number(Number(u.fromSI(Number(s)).toPrecision(4))));
  const range = new RegExp(`(${NUM_RE})(\\s+(?:to|and up to)\\s+)(${NUM_RE})\\s*${escape(u.si)}(?![\\w²³/])`, "g");
  let out = message.replace(range, (_m, a: string, mid: string, b: string) => `${show(a)}${mid}${show(b)} ${u.label}`);
  if (q === "temperature") out = out.replace(new RegExp(`(${NUM_RE})\\s*°C`, "g"), (_m, a: string) => `${show(a)} ${u.label}`);
  return out;
}

/* ------------------------------------------------------------------ */
/* Results in the user's units                                          */
/* ------------------------------------------------------------------ */

/** A computed value (SI or the trade's unit as the engine states it) in the project's units. */
export function displayValue(value: number, unit: string, system: UnitSystem): { value: number; unit: string } {
  if (system === "imperial") {
    if (unit === "°C") return { value: cToTemp(value, "F"), unit: "°F" };
    if (unit === "W/m") return { value: value * 0.3048, unit: "W/ft" };
    if (unit === "mm²") return { value: areaToKcmil(value * 1e-6), unit: "kcmil" };
  }
  return { value, unit };
}

/** Imperial area helper for hints: kcmil of an AWG-style size. */
export function kcmilOf(size: string): number {
  return areaToKcmil(parseConductorSize(size));
}

export { kcmilToArea_m2 };

/** A typed display value of a quantity → SI, or undefined when it is not a number. */
export function toSIQuantity(q: QuantityKind, system: UnitSystem, text: string): number | undefined {
  const t = text.trim().replace(/\s+/g, "");
  if (!NUMERIC.test(t)) return undefined;
  return toSIRounded(UNITS[q][system], Number(t));
}
