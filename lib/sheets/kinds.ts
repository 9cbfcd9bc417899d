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
  /**
   * Parts of the engine input the form does not hold, derived from what it does (a bus
   * network's node list from its segments). Applied to the form's SI values before they
   * are calculated or saved.
   */
  complete?: (inputs: Record<string, unknown>) => Record<string, unknown>;
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
 * The node list of a bus network: every node a segment names, in the order first
 * named, then supply nodes not on any segment (a supply alone is still a network).
 * Load nodes are not added: a load on a name no segment reaches is reported by the
 * engine ("load node … is not in the node list"), which catches a mistyped name.
 */
export function networkNodes(inputs: Record<string, unknown>): { id: string }[] {
  const seen = new Set<string>();
  const out: { id: string }[] = [];
  const add = (v: unknown) => {
    if (typeof v !== "string") return;
    const id = v.trim();
    if (id === "" || seen.has(id)) return;
    seen.add(id);
    out.push({ id });
  };
  const rows = (v: unknown) => (Array.isArray(v) ? (v as unknown[]).filter((x): x is Record<string, unknown> => typeof x === "object" && x !== null) : []);
  for (const s of rows(inputs.segments)) {
    add(s.from);
    add(s.to);
  }
  for (const s of rows(inputs.supplies)) add(s.node);
  return out;
}

/**
 * A small panel to start from: an incomer feeding three main-bus sections, a dropper
 * from each section joint and tap-off cables to the outgoing loads, one spare tap-off
 * left unloaded (it shows as a branch carrying no current). Copper main bus of
 * 1 000 mm² (2 × 50 × 10 mm), 240 mm² droppers, 35 and 16 mm² tap-offs (or the nearest
 * kcmil/AWG sizes for the North-American family); ampacities are typical catalogue
 * values to be replaced by the engineer's own.
 */
function busNetworkDefaults(p: ProjectBasis) {
  const na = p.standardFamily === "north-american";
  const dc = p.systemType === "dc";
  const ft = 0.3048;
  const len = (metric: number, feet: number) => (na ? Number((feet * ft).toPrecision(6)) : metric);
  const phaseVoltage = dc || p.systemType === "1ph" ? p.systemVoltage : p.systemVoltage / Math.sqrt(3);
  const conductors = [
    { id: "main", materialId: "cu-etp", area_m2: na ? 1.29e-3 : 1e-3, conductorTemperature_C: 90, reactance_ohm_per_m: 1.5e-4, ampacity_A: na ? 2000 : 1600 },
    { id: "dropper", materialId: "cu-etp", area_m2: na ? 253.4e-6 : 240e-6, conductorTemperature_C: 90, reactance_ohm_per_m: 1.8e-4, ampacity_A: na ? 500 : 520 },
    { id: "tap-35", materialId: "cu-annealed", area_m2: na ? 33.62e-6 : 35e-6, conductorTemperature_C: 70, reactance_ohm_per_m: 8e-5, ampacity_A: na ? 115 : 125 },
    { id: "tap-16", materialId: "cu-annealed", area_m2: na ? 13.3e-6 : 16e-6, conductorTemperature_C: 70, reactance_ohm_per_m: 8.5e-5, ampacity_A: na ? 65 : 76 },
  ];
  const segments = [
    { id: "MB-1", from: "INC", to: "J1", conductor: "main", length_m: len(0.6, 2) },
    { id: "MB-2", from: "J1", to: "J2", conductor: "main", length_m: len(0.8, 2.5) },
    { id: "MB-3", from: "J2", to: "J3", conductor: "main", length_m: len(0.8, 2.5) },
    { id: "DR-1", from: "J1", to: "D1", conductor: "dropper", length_m: len(1.2, 4) },
    { id: "DR-2", from: "J2", to: "D2", conductor: "dropper", length_m: len(1.2, 4) },
    { id: "DR-3", from: "J3", to: "D3", conductor: "dropper", length_m: len(1.2, 4) },
    { id: "TO-1", from: "D1", to: "M1", conductor: "tap-35", length_m: len(8, 25) },
    { id: "TO-2", from: "D1", to: "L1", conductor: "tap-16", length_m: len(12, 40) },
    { id: "TO-3", from: "D2", to: "M2", conductor: "tap-35", length_m: len(15, 50) },
    { id: "TO-4", from: "D2", to: "SP1", conductor: "tap-16", length_m: len(3, 10) },
    { id: "TO-5", from: "D3", to: "M3", conductor: "tap-35", length_m: len(20, 65) },
    { id: "TO-6", from: "D3", to: "L2", conductor: "tap-16", length_m: len(10, 30) },
  ];
  const pf = (x: number) => (dc ? 1 : x);
  const loads = [
    { node: "M1", current_A: 80, pf: pf(0.85) },
    { node: "L1", current_A: 32, pf: pf(0.95) },
    { node: "M2", current_A: 65, pf: pf(0.85) },
    { node: "M3", current_A: 90, pf: pf(0.82) },
    { node: "L2", current_A: 25, pf: pf(1) },
  ];
  const inputs: Record<string, unknown> = {
    mode: dc ? "dc" : "ac",
    frequency_Hz: dc ? 50 : clamp(p.frequency || 50, 1, 1000),
    ambient_C: clamp(p.designAmbientC, -40, 80),
    maxTemperature_C: 90,
    dropLimit_pct: na ? 3 : 4,
    conductors,
    segments,
    supplies: [{ node: "INC", voltage_V: Number(phaseVoltage.toPrecision(6)), angle_deg: 0 }],
    loads,
  };
  return { ...inputs, nodes: networkNodes(inputs) };
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
  {
    kind: "bus-network",
    name: "Bus network",
    summary: "Currents, voltage drops, losses and temperature rises in a panel's distribution: incomer, main bus, droppers, tap-offs and loads.",
    tagPrefix: "BN",
    heavy: true,
    cautioned: true,
    defaults: busNetworkDefaults,
    complete: (inputs) => ({ ...inputs, nodes: networkNodes(inputs) }),
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
