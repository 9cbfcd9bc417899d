/**
 * The kinds of calculation sheet an engineer can add to a project, in Ohmstead's own
 * words, each mapped to an engine calculation kind, with starting inputs (SI) taken
 * from the project: system voltage and type, frequency, design ambient, altitude and
 * standard family. Pure: used by server pages and client components alike.
 */
import type { StandardFamily, SystemType, UnitSystem } from "@/db/schema/projects";

/** What a new sheet needs from its project. */
export interface ProjectBasis {
  unitSystem: UnitSystem;
  systemVoltage: number;
  systemType: SystemType;
  /** 50 or 60; 0 for DC. */
  frequency: number;
  designAmbientC: number;
  altitudeM: number;
  standardFamily: StandardFamily;
}

export interface SheetKindDef {
  /** The engine kind (also stored as the sheet's kind). */
  kind: string;
  /** Name in the product ("Busbar rating"). */
  name: string;
  /** One line saying what the sheet answers. */
  summary: string;
  /** Prefix of suggested tags ("BR-01"). */
  tagPrefix: string;
  /** Runs in a web worker: the filament method can take longer than a frame. */
  heavy: boolean;
  /** The result is thermal, fault or voltage-drop: shown with the caution. */
  cautioned: boolean;
  /** Starting inputs, SI, from the project. */
  defaults: (p: ProjectBasis) => Record<string, unknown>;
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
const INCH = 0.0254;

function phasesOf(t: SystemType): 1 | 2 | 3 {
  return t === "3ph-4w" || t === "3ph-3w" ? 3 : 2;
}

/** A usual main-bus arrangement: 2 × 100 × 10 mm copper on edge (or 2 × 4 × ¼ in). */
function defaultArrangement(p: ProjectBasis) {
  const na = p.standardFamily === "north-american";
  const w = na ? 4 * INCH : 0.1;
  const t = na ? 0.25 * INCH : 0.01;
  return { barWidth_m: w, barThickness_m: t, barsPerPhase: 2, gap_m: t, phases: phasesOf(p.systemType), phaseSpacing_m: na ? 4 * INCH : 0.1, orientation: "edge" };
}

/**
 * Starting bar temperature limit, to be confirmed by the engineer: 105 °C (a 70 K rise
 * over a 35 °C ambient) is common practice for bare copper under IEC 61439-1, whose
 * Table 6 ties the limit to the materials in contact; a 65 K rise for the
 * North-American family (from memory).
 */
function barLimit(p: ProjectBasis): number {
  return p.standardFamily === "north-american" ? clamp(p.designAmbientC + 65, 60, 150) : clamp(Math.max(105, p.designAmbientC + 50), 60, 150);
}

/**
 * Every sheet kind. The new-sheet page offers only those whose engine kind is
 * registered (`isCalcKind`, checked on the server so the engine stays out of the
 * browser bundles that only need names).
 */
export const SHEET_KINDS: readonly SheetKindDef[] = [
  {
    kind: "busbar-rating",
    name: "Busbar rating",
    summary: "Temperature at a current and the current at a temperature limit of a bar arrangement, with losses per metre and Rac/Rdc.",
    tagPrefix: "BR",
    heavy: true,
    cautioned: true,
    defaults: (p) => ({
      arrangement: defaultArrangement(p),
      materialId: "cu-etp",
      temperId: p.standardFamily === "north-american" ? undefined : "R240",
      finish: "oxidised",
      ambient_C: clamp(p.designAmbientC, -40, 100),
      altitude_m: clamp(p.altitudeM, 0, 5000),
      frequency_Hz: p.frequency,
      current_A: 2000,
      maxTemperature_C: barLimit(p),
    }),
  },
  {
    kind: "busbar-sizing",
    name: "Busbar sizing",
    summary: "The standard bar arrangements that carry a current within the temperature limit, smallest first, to pick one from.",
    tagPrefix: "BS",
    heavy: true,
    cautioned: true,
    defaults: (p) => ({
      current_A: 1600,
      frequency_Hz: p.frequency,
      materialIds: ["cu-etp"],
      finish: "oxidised",
      ambient_C: clamp(p.designAmbientC, -40, 100),
      altitude_m: clamp(p.altitudeM, 0, 5000),
      orientation: "edge",
      phases: phasesOf(p.systemType),
      phaseClearance_m: p.standardFamily === "north-american" ? 2 * INCH : 0.05,
      series: p.standardFamily === "north-american" ? "inch" : "metric",
      maxBarsPerPhase: 4,
      maxTemperature_C: barLimit(p),
      maxResults: 10,
      maxFailures: 5,
    }),
  },
  {
    kind: "voltage-drop",
    name: "Feeder voltage drop",
    summary: "Voltage at the far end of a feeder, the drop against the limit and the voltage along the route.",
    tagPrefix: "VD",
    heavy: false,
    cautioned: true,
    defaults: (p) => {
      const na = p.standardFamily === "north-american";
      const system = { "3ph-4w": "ac-3ph-4w", "3ph-3w": "ac-3ph-3w", "1ph": "ac-1ph-2w", dc: "dc-2w" }[p.systemType];
      return {
        system,
        nominalVoltage_V: p.systemVoltage,
        voltageAt: "sending",
        current_A: 100,
        powerFactor: p.systemType === "dc" ? 1 : 0.85,
        leading: false,
        frequency_Hz: p.frequency,
        length_m: na ? 150 * 0.3048 : 50,
        materialId: "cu-annealed",
        area_m2: na ? 67.43e-6 : 35e-6,
        parallel: 1,
        resistanceSource: na ? "resistivity" : "iec-60228",
        insulation: na ? "xlpe" : "pvc",
        ambient_C: clamp(p.designAmbientC, -40, 80),
        temperatureBasis: "auto",
        method: "exact",
        limitId: na ? "nec-feeder" : "iec-a-other",
        upstreamDrop_percent: 0,
        sizeSeries: na ? "awg-kcmil" : "iec-60228",
        profilePoints: 21,
      };
    },
  },
  {
    kind: "fault-withstand",
    name: "Fault withstand",
    summary: "Short-time thermal withstand and the electromagnetic forces and stresses on the bars and supports.",
    tagPrefix: "FW",
    heavy: false,
    cautioned: true,
    defaults: (p) => ({
      I_kA: 50,
      t_s: 1,
      frequency_Hz: p.frequency >= 10 ? p.frequency : 50,
      peak: { mode: "table" },
      dcComponent: false,
      materialId: "cu-etp",
      temperId: "R240",
      conductor: { type: "bars", arrangement: defaultArrangement(p) },
      insulationId: "bare-busbar",
      span_m: 0.5,
      supportId: "continuous-3plus",
      vSigmaVr: 1,
      vFVr: 2.7,
    }),
  },
  {
    kind: "enclosure-heat",
    name: "Enclosure heat budget",
    summary: "Internal air temperature of an enclosure from its device and conductor losses, and the cooling it needs.",
    tagPrefix: "EH",
    heavy: false,
    cautioned: true,
    defaults: (p) => ({
      width_m: 0.8,
      height_m: 2.0,
      depth_m: 0.6,
      installation: "free-standing",
      heatTransfer_W_m2K: 5.5,
      ambient_C: clamp(p.designAmbientC, -40, 70),
      targetInternal_C: clamp(Math.max(40, p.designAmbientC + 5), -40, 120),
      losses: [],
    }),
  },
  {
    kind: "parallel-sharing",
    name: "Parallel sharing",
    summary: "How a current divides between parallel cables or bars of unequal length or size, with each path opened in turn.",
    tagPrefix: "PS",
    heavy: false,
    cautioned: true,
    defaults: (p) => ({
      mode: p.systemType === "dc" ? "dc" : "ac",
      current_A: 800,
      ambient_C: clamp(p.designAmbientC, -40, 80),
      maxTemperature_C: 90,
      paths: [
        { name: "Cable 1", materialId: "cu-annealed", area_m2: 240e-6, length_m: 20, count: 1, conductorTemperature_C: 70, reactance_ohm_per_m: 0.08e-3, acResistanceFactor: 1, ampacityPerConductor_A: 450 },
        { name: "Cable 2", materialId: "cu-annealed", area_m2: 240e-6, length_m: 24, count: 1, conductorTemperature_C: 70, reactance_ohm_per_m: 0.08e-3, acResistanceFactor: 1, ampacityPerConductor_A: 450 },
      ],
    }),
  },
];

export function sheetKind(kind: string): SheetKindDef | undefined {
  return SHEET_KINDS.find((k) => k.kind === kind);
}

/** The product name of a kind, or the engine's kind id for kinds without a sheet form. */
export function sheetKindName(kind: string): string {
  return SHEET_KINDS.find((k) => k.kind === kind)?.name ?? kind;
}

/** Starting inputs of a new sheet of `kind` in a project, SI, with absent values dropped. */
export function defaultInputs(kind: string, p: ProjectBasis): Record<string, unknown> {
  const def = sheetKind(kind);
  if (!def) return {};
  return JSON.parse(JSON.stringify(def.defaults(p))) as Record<string, unknown>;
}

/** A suggested tag: the kind's prefix and the next free number among `taken`. */
export function suggestTag(kind: string, taken: readonly string[]): string {
  const prefix = sheetKind(kind)?.tagPrefix ?? "SH";
  const set = new Set(taken.map((t) => t.toUpperCase()));
  for (let n = 1; n < 1000; n++) {
    const tag = `${prefix}-${String(n).padStart(2, "0")}`;
    if (!set.has(tag)) return tag;
  }
  return `${prefix}-${Date.now().toString(36).toUpperCase()}`;
}
