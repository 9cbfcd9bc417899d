/**
 * Voltage drop of a feeder: DC two-wire, single-phase two-wire, balanced three-phase
 * three- and four-wire. Two methods:
 *   approximate — IEC 60364-5-52:2009 Annex G §G.52.2: u = b·(ρ1·L/S·cos φ + λ·L·sin φ)·I_B
 *   exact       — phasor V_s = V_r + I·Z of the per-phase (or loop) circuit, the load drawing a
 *                 constant current at the given power factor.
 * The fast functions at the top take plain numbers and allocate nothing; `voltageDrop`
 * validates its input with zod and wraps them.
 */
import { z } from "zod";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";
import { material, MATERIAL_IDS, resistivity20, resistivityAt, type Material, type Metal } from "./materials";
import { iec60228Sizes, usConductorSizes } from "./conductors";
import limitsTable from "../../reference-tables/voltage-drop-limits.json";
import { CABLE_INSULATIONS, iec60228Resistance20, insulationMaxTemperature, skinEffectFactor } from "./cable-ampacity";
import {
  ampacityFromTable,
  ampacityRowSchema,
  findAmpacityRow,
  GROUPING_ARRANGEMENTS,
  GROUPING_FACTORS,
  installationCode,
  TABLE_INSULATIONS,
  tableSizes,
  tableText,
  type AmpacityRow,
} from "./ampacity-table";

export const SUPPLY_SYSTEMS = ["dc-2w", "ac-1ph-2w", "ac-3ph-3w", "ac-3ph-4w"] as const;
export type SupplySystem = (typeof SUPPLY_SYSTEMS)[number];

/** IEC 60364-5-52 Annex G: λ = 0.08 mΩ/m when the reactance is not otherwise known. */
export const DEFAULT_REACTANCE_OHM_PER_M = 0.08e-3;

/**
 * ρ1 of IEC 60364-5-52 Annex G: the resistivity in normal service, 1.25 × the value at 20 °C,
 * printed as 0.0225 Ω·mm²/m for copper and 0.036 Ω·mm²/m for aluminium.
 */
export const ANNEX_G_RESISTIVITY_OHM_M = { copper: 0.0225e-6, aluminium: 0.036e-6 } as const;

/** b of IEC 60364-5-52 Annex G: 1 for three-phase (drop per phase), 2 for a go-and-return loop. */
export function loopFactor(system: SupplySystem): 1 | 2 {
  return system === "ac-3ph-3w" || system === "ac-3ph-4w" ? 1 : 2;
}

function isThreePhase(system: SupplySystem): boolean {
  return loopFactor(system) === 1;
}

// ---------------------------------------------------------------------------------------
// Fast, allocation-free kernels.
// r, x: resistance and reactance per metre of one phase (already divided by the number of
// parallel conductors); sinPhi > 0 for a lagging (inductive) load, < 0 for leading.
// ---------------------------------------------------------------------------------------

/**
 * Approximate drop u, V, of IEC 60364-5-52:2009 Annex G: u = b·(R·cos φ + X·sin φ)·I_B
 * (per phase for three-phase, b = 1; loop for single-phase and DC, b = 2).
 */
export function voltageDropApprox(b: number, r_ohm_per_m: number, x_ohm_per_m: number, length_m: number, current_A: number, cosPhi: number, sinPhi: number): number {
  return b * (r_ohm_per_m * cosPhi + x_ohm_per_m * sinPhi) * length_m * current_A;
}

/**
 * Exact phasor drop |V_s| − |V_r|, V, of the per-phase (b = 1) or loop (b = 2) circuit.
 * With V_r on the real axis and I = I_B·(cos φ − j·sin φ):
 *   I·Z = a + j·c,  a = b·L·I_B·(r·cos φ + x·sin φ),  c = b·L·I_B·(x·cos φ − r·sin φ).
 * Receiving end given (|V_r| = V): |V_s| = √((V + a)² + c²).
 * Sending end given (|V_s| = V): |V_r| = √(V² − c²) − a, the exact root of |V_r + I·Z| = V.
 * `voltage_V` is the phase voltage (U0) for three-phase, the circuit voltage otherwise.
 * Returns NaN when no receiving-end voltage exists (the feeder cannot carry the current).
 */
export function voltageDropExact(
  b: number,
  r_ohm_per_m: number,
  x_ohm_per_m: number,
  length_m: number,
  current_A: number,
  cosPhi: number,
  sinPhi: number,
  voltage_V: number,
  sendingEndGiven: boolean,
): number {
  const k = b * length_m * current_A;
  const a = k * (r_ohm_per_m * cosPhi + x_ohm_per_m * sinPhi);
  const c = k * (x_ohm_per_m * cosPhi - r_ohm_per_m * sinPhi);
  if (sendingEndGiven) {
    const disc = voltage_V * voltage_V - c * c;
    if (disc < 0) return Number.NaN;
    const vr = Math.sqrt(disc) - a;
    return vr > 0 ? voltage_V - vr : Number.NaN;
  }
  const re = voltage_V + a;
  return Math.sqrt(re * re + c * c) - voltage_V;
}

// ---------------------------------------------------------------------------------------
// Standard size series for the size search
// ---------------------------------------------------------------------------------------

export const SIZE_SERIES = ["iec-60228", "awg-kcmil"] as const;
export type SizeSeries = (typeof SIZE_SERIES)[number];

/** Smallest section for power circuits of fixed installations: 1.5 mm² Cu, 16 mm² Al — IEC 60364-5-52:2009 Table 52.2 (from memory). */
const MIN_POWER_SECTION_MM2 = { copper: 1.5, aluminium: 16 } as const;

/** Standard sizes, ascending: IEC 60228 class 2 sizes of the metal, or AWG 14…4/0 and 250…1000 kcmil (ASTM B258). */
export function standardSizes(series: SizeSeries, metal: Metal = "copper"): { label: string; area_m2: number }[] {
  if (series === "iec-60228")
    return iec60228Sizes(2, metal)
      .filter((a) => a >= MIN_POWER_SECTION_MM2[metal])
      .map((a) => ({ label: `${a} mm²`, area_m2: a * 1e-6 }));
  return usConductorSizes().map((e) => ({ label: /kcmil/i.test(e.size) ? e.size : `${e.size} AWG`, area_m2: e.area_m2 }));
}

// ---------------------------------------------------------------------------------------
// Limits
// ---------------------------------------------------------------------------------------

export const VOLTAGE_DROP_LIMIT_IDS = ["iec-a-lighting", "iec-a-other", "iec-b-lighting", "iec-b-other", "nec-branch", "nec-feeder", "nec-total"] as const;
export type VoltageDropLimitId = (typeof VOLTAGE_DROP_LIMIT_IDS)[number];

export interface VoltageDropLimit {
  id: string;
  name: string;
  percent: number;
  source: string;
}

export function voltageDropLimit(id: VoltageDropLimitId): VoltageDropLimit {
  const row = limitsTable.limits.find((l) => l.id === id);
  if (!row) throw new Error(`unknown voltage-drop limit "${id}"`);
  const src = row.source
    .split(";")
    .map((s) => (limitsTable.sources as Record<string, string>)[s.trim()] ?? s.trim())
    .join("; ");
  return { id: row.id, name: row.name, percent: row.percent, source: src };
}

/**
 * Limit in percent for a wiring system of `length_m`, with the IEC 60364-5-52 Annex G
 * supplement for runs beyond 100 m (0.005 %/m, at most 0.5 %) where it applies.
 */
export function applicableLimitPercent(id: VoltageDropLimitId, length_m: number): { percent: number; supplement: number } {
  const base = voltageDropLimit(id).percent;
  const s = limitsTable.longRunSupplement;
  if (!s.appliesTo.includes(id) || length_m <= s.beyond_m) return { percent: base, supplement: 0 };
  const supplement = Math.min(s.maxSupplement_percent, (length_m - s.beyond_m) * s.percentPerMetre);
  return { percent: base + supplement, supplement };
}

// ---------------------------------------------------------------------------------------
// Conductor temperature and resistance
// ---------------------------------------------------------------------------------------

export const TEMPERATURE_BASES = ["auto", "maximum", "load", "annex-g", "given"] as const;
export type TemperatureBasis = (typeof TEMPERATURE_BASES)[number];

/**
 * Conductor temperature at the load current: θ = θ_a + (θ_max − θ_a)·(I_B/I_z)² — the steady
 * temperature rise scales with the losses, I² (common practice; CENELEC CLC/TR 50480 uses
 * this form — from memory). Resistance change with temperature is neglected in the scaling.
 */
export function conductorTemperatureAtLoad(ambient_C: number, theta_max_C: number, load_A: number, ampacity_A: number): number {
  const ratio = load_A / ampacity_A;
  return ambient_C + (theta_max_C - ambient_C) * ratio * ratio;
}

/** Resistance per metre of one conductor at θ: R_θ = R_20·(β + θ)/(β + 20), IEC 60287-1-1 §2.1.1. */
export function conductorResistanceAt(m: Material, area_m2: number, theta_C: number, r20_ohm_per_m?: number): number {
  if (r20_ohm_per_m !== undefined) return (r20_ohm_per_m * (m.beta_K + theta_C)) / (m.beta_K + 20);
  return resistivityAt(m, theta_C) / area_m2;
}

// ---------------------------------------------------------------------------------------
// Validated calculation
// ---------------------------------------------------------------------------------------

/**
 * The organisation ampacity table a feeder takes its current-carrying capacity from: a
 * snapshot of the version used (only the rows of the chosen material, insulation and
 * installation), so the stored sheet recomputes alone and its hash covers the values.
 */
export const feederAmpacityTableSchema = z.object({
  table: z.object({
    id: int("Ampacity table", 1, 4_294_967_295),
    name: z.preprocess(tableText, z.string({ error: "Ampacity table name is required (1 to 120 characters)" }).trim().min(1, { message: "Ampacity table name is required (1 to 120 characters)" }).max(120)),
    version: int("Ampacity table version", 1, 1_000_000),
    source: z.preprocess(tableText, z.string().max(500)).optional(),
    rows: z
      .array(ampacityRowSchema)
      .min(1, { message: "The ampacity table snapshot has no rows for this material, insulation and installation method" })
      .max(5000, { message: "The ampacity table snapshot may have at most 5000 rows" }),
  }),
  installation: installationCode,
  insulation: choice("Table insulation", TABLE_INSULATIONS),
  /** IEC 60364-5-52 Table B.52.17 arrangement; none = no grouping reduction. */
  groupingArrangement: choice("Grouping arrangement", GROUPING_ARRANGEMENTS).optional(),
  circuits: int("Circuits or multi-core cables in the group", 1, 100).default(1),
});
export type FeederAmpacityTable = z.output<typeof feederAmpacityTableSchema>;

export const voltageDropInputSchema = z
  .object({
    system: choice("Supply system", SUPPLY_SYSTEMS),
    /** Line-to-line for three-phase; the circuit voltage for single-phase and DC. */
    nominalVoltage_V: num("Nominal voltage", "V", 1, 100_000, { exclusiveMin: true }),
    /** Which end the nominal voltage is held at. */
    voltageAt: choice("Voltage given at", ["sending", "receiving"] as const).default("sending"),
    current_A: num("Load current", "A", 0, 100_000),
    powerFactor: num("Power factor", "", 0, 1).default(1),
    leading: z.boolean().default(false),
    frequency_Hz: num("Frequency", "Hz", 0, 1000).default(50),
    length_m: num("Route length", "m", 0, 100_000),
    materialId: choice("Conductor material", MATERIAL_IDS).default("cu-annealed"),
    area_m2: num("Conductor cross-section", "m²", 0, 0.01, { exclusiveMin: true }),
    parallel: int("Conductors in parallel per phase", 1, 8).default(1),
    /** Resistance at 20 °C of one conductor, Ω/m (e.g. IEC 60228 Table 2 maximum); else from resistivity. */
    resistance20_ohm_per_m: num("Conductor resistance at 20 °C", "Ω/m", 0, 1, { exclusiveMin: true }).optional(),
    /** Where the 20 °C resistance comes from when not given: IEC 60228 Table 2 (standard metric sizes) or ρ20/S. */
    resistanceSource: choice("Resistance source", ["iec-60228", "resistivity"] as const).default("iec-60228"),
    /** Reactance of one conductor, Ω/m; IEC 60364-5-52 Annex G default 0.08 mΩ/m. */
    reactance_ohm_per_m: num("Reactance", "Ω/m", 0, 0.01).optional(),
    insulation: choice("Insulation", CABLE_INSULATIONS).default("pvc"),
    ambient_C: num("Ambient temperature", "°C", -40, 80).default(30),
    /** Current-carrying capacity I_z of the whole phase (all parallel conductors), A. */
    ampacity_A: num("Current-carrying capacity", "A", 0, 100_000, { exclusiveMin: true }).optional(),
    /** Or I_z from an organisation ampacity table with the ambient and grouping corrections. */
    ampacityFromTable: feederAmpacityTableSchema.optional(),
    temperatureBasis: choice("Temperature basis", TEMPERATURE_BASES).default("auto"),
    conductorTemperature_C: num("Conductor temperature", "°C", -40, 250).optional(),
    method: choice("Method", ["approximate", "exact"] as const).default("exact"),
    limitId: choice("Voltage-drop limit", VOLTAGE_DROP_LIMIT_IDS).default("iec-a-other"),
    /** Organisation override of the limit, percent. */
    limitPercent: num("Voltage-drop limit", "%", 0, 50, { exclusiveMin: true }).optional(),
    /** Drop already taken upstream of this feeder, percent; checked together against the limit. */
    upstreamDrop_percent: num("Upstream voltage drop", "%", 0, 50).default(0),
    sizeSeries: choice("Standard size series", SIZE_SERIES).default("iec-60228"),
    profilePoints: int("Profile points", 2, 201).default(21),
  })
  .superRefine((v, ctx) => {
    if (v.temperatureBasis === "given" && v.conductorTemperature_C === undefined)
      ctx.addIssue({ code: "custom", path: ["conductorTemperature_C"], message: "Conductor temperature is required when the temperature basis is \"given\" (-40 to 250 °C)" });
    if (v.temperatureBasis === "load" && v.ampacity_A === undefined && v.ampacityFromTable === undefined)
      ctx.addIssue({ code: "custom", path: ["ampacity_A"], message: "Current-carrying capacity is required when the temperature basis is \"load\" (greater than 0 A)" });
  });

export type VoltageDropInput = z.input<typeof voltageDropInputSchema>;
export type VoltageDropParsed = z.output<typeof voltageDropInputSchema>;

export interface ProfilePoint {
  distance_m: number;
  voltage_V: number;
}

export interface VoltageDropResults {
  method: "approximate" | "exact";
  /** Which end holds the nominal voltage; the other end is solved. */
  solvedFor: "receiving-end voltage (sending end given)" | "sending-end voltage (receiving end given)";
  /** Line-to-line for three-phase. */
  sendingVoltage_V: number;
  receivingVoltage_V: number;
  /** Drop of the method chosen, in the same reference as the nominal voltage (line-to-line for three-phase). */
  drop_V: number;
  drop_percent: number;
  /** Annex G u: per phase (three-phase) or loop (single-phase, DC), V. */
  u_V: number;
  dropApprox_V: number;
  dropApprox_percent: number;
  dropExact_V: number;
  dropExact_percent: number;
  totalDrop_percent: number;
  conductorTemperature_C: number;
  temperatureBasis: string;
  /** Of one conductor at the conductor temperature, including skin effect for AC. */
  resistance_ohm_per_m: number;
  reactance_ohm_per_m: number;
  /** Of one phase (parallel conductors combined) over the route length. */
  phaseResistance_ohm: number;
  phaseReactance_ohm: number;
  limit_percent: number;
  limitSource: string;
  profile: ProfilePoint[];
  /** Smallest standard size (same number in parallel) meeting the limit at θ_max, or null if none. */
  minimumSize: { label: string; area_m2: number; drop_percent: number } | null;
  /** I_z of the phase used, A, when it came from an organisation ampacity table. */
  tableAmpacity_A?: number;
  /** How I_z was taken from the organisation's table (present only then). */
  ampacityTable?: FeederAmpacityTableUse;
}

export interface FeederAmpacityTableUse {
  id: number;
  name: string;
  version: number;
  source?: string;
  /** "Ampacity table <name> v<version>": the phrase results, PDFs and intermediates use. */
  title: string;
  /** Size, material, insulation and installation of the row used ("95 mm² copper XLPE, installation E"). */
  rowLabel: string;
  row: AmpacityRow;
  installation: string;
  insulation: string;
  ambientFactor: number;
  groupingFactor: number;
  groupingSource: string;
  groupingArrangement?: string;
  circuits: number;
  parallel: number;
  ampacity_A: number;
}

const mm2Text = (a_m2: number) => `${Number((a_m2 * 1e6).toPrecision(4))} mm²`;
const sizeText = (r: { label?: string; size_m2: number }) => r.label || mm2Text(r.size_m2);

/**
 * I_z of the phase from an organisation table: I_z = n·I_tab·k_θ·k_g, the row matched on
 * size, the metal of the conductor material, the table insulation and installation method.
 * A size the table lacks is a field message on the cross-section naming the sizes it has.
 */
export function feederAmpacityFromTable(v: VoltageDropParsed, t: FeederAmpacityTable): { use: FeederAmpacityTableUse; warnings: Warning[] } {
  const metal = material(v.materialId).metal;
  const title = `Ampacity table ${t.table.name} v${t.table.version}`;
  const table = { name: t.table.name, rows: t.table.rows };
  const row = findAmpacityRow(table, v.area_m2, metal, t.insulation, t.installation);
  if (!row) {
    const sizes = tableSizes(table, metal, t.insulation, t.installation);
    const labelled = sizes.map((a) => sizeText(t.table.rows.find((r) => r.size_m2 === a) ?? { size_m2: a }));
    const what = `${metal} ${t.insulation.toUpperCase()}, installation "${t.installation}"`;
    throw new EngineError(
      "no-table-row",
      sizes.length === 0
        ? `${title} has no rows for ${what}; choose another installation method or insulation`
        : `${title} has no row for ${mm2Text(v.area_m2)} (${what}); its sizes are ${labelled.join(", ")}`,
      "area_m2",
    );
  }
  const lookup = ampacityFromTable({
    table,
    size_m2: v.area_m2,
    material: metal,
    insulation: t.insulation,
    installation: t.installation,
    ambient_C: v.ambient_C,
    ...(t.groupingArrangement ? { grouping: { arrangement: t.groupingArrangement, circuits: t.circuits } } : {}),
  });
  const r = lookup.results;
  const warnings = [...lookup.warnings];
  const thetaMax = insulationMaxTemperature(v.insulation, v.area_m2);
  if (Math.abs(row.conductorMax_C - thetaMax) > 0.5)
    warnings.push({
      code: "table-insulation-mismatch",
      message: `The table row is for a conductor maximum of ${row.conductorMax_C} °C but the feeder's insulation (${v.insulation.toUpperCase()}) allows ${thetaMax} °C: check that both describe the same cable.`,
    });
  if (v.ampacity_A !== undefined) warnings.push({ code: "entered-ampacity-ignored", message: `The entered current-carrying capacity (${v.ampacity_A} A) was not used: ${title} gives I_z.` });
  const use: FeederAmpacityTableUse = {
    id: t.table.id,
    name: t.table.name,
    version: t.table.version,
    ...(t.table.source ? { source: t.table.source } : {}),
    title,
    rowLabel: `${sizeText(row)} ${row.material} ${row.insulation.toUpperCase()}, installation ${row.installation}`,
    row,
    installation: t.installation,
    insulation: t.insulation,
    ambientFactor: r.ambientFactor,
    groupingFactor: r.groupingFactor,
    groupingSource: r.groupingSource,
    ...(t.groupingArrangement ? { groupingArrangement: t.groupingArrangement } : {}),
    circuits: t.circuits,
    parallel: v.parallel,
    ampacity_A: r.corrected_A * v.parallel,
  };
  return { use, warnings };
}

interface Resolved {
  theta_C: number;
  basisId: Exclude<TemperatureBasis, "auto">;
  basis: string;
  r: number;
  x: number;
  ys: number;
}

function resolveConductor(v: VoltageDropParsed, area_m2: number, forceMax: boolean): Resolved {
  const m = material(v.materialId);
  const thetaMax = insulationMaxTemperature(v.insulation, area_m2);
  let basis = v.temperatureBasis;
  if (basis === "auto") basis = v.ampacity_A !== undefined ? "load" : "maximum";
  if (forceMax && basis !== "annex-g" && basis !== "given") basis = "maximum";
  let theta: number;
  let label: string;
  let rdc: number;
  if (basis === "annex-g") {
    const rho1 = ANNEX_G_RESISTIVITY_OHM_M[m.metal];
    // Temperature at which the material's resistivity equals ρ1: θ = (ρ1/ρ20)(β + 20) − β.
    theta = (rho1 / resistivity20(m)) * (m.beta_K + 20) - m.beta_K;
    label = "IEC 60364-5-52 Annex G ρ1 = 1.25·ρ20 (0.0225 Ω·mm²/m Cu, 0.036 Ω·mm²/m Al)";
    rdc = rho1 / area_m2;
  } else {
    if (basis === "given") {
      theta = v.conductorTemperature_C!;
      label = "conductor temperature given";
    } else if (basis === "load") {
      theta = conductorTemperatureAtLoad(v.ambient_C, thetaMax, v.current_A, v.ampacity_A!);
      label = "at the load current: θ = θa + (θmax − θa)·(I_B/I_z)²";
    } else {
      theta = thetaMax;
      label = "at the insulation's maximum continuous temperature θmax (conservative)";
    }
    // Order: the given 20 °C value (this size only), IEC 60228 Table 2 maximum, then ρ20/S.
    const r20 = (forceMax ? undefined : v.resistance20_ohm_per_m) ?? (v.resistanceSource === "iec-60228" ? iec60228Resistance20(m.metal, area_m2) : undefined);
    rdc = conductorResistanceAt(m, area_m2, theta, r20);
  }
  const ac = v.system !== "dc-2w";
  // Annex G's ρ1 already stands for the service resistance: no skin-effect factor on top.
  const ys = ac && basis !== "annex-g" ? skinEffectFactor(rdc, v.frequency_Hz) : 0;
  const x = ac ? (v.reactance_ohm_per_m ?? DEFAULT_REACTANCE_OHM_PER_M) : 0;
  return { theta_C: theta, basisId: basis, basis: label, r: rdc * (1 + ys), x, ys };
}

function phaseVoltage(system: SupplySystem, nominal_V: number): number {
  return isThreePhase(system) ? nominal_V / Math.sqrt(3) : nominal_V;
}

function pfAngle(v: VoltageDropParsed): { cos: number; sin: number } {
  if (v.system === "dc-2w") return { cos: 1, sin: 0 };
  const cos = v.powerFactor;
  const sin = Math.sqrt(Math.max(0, 1 - cos * cos)) * (v.leading ? -1 : 1);
  return { cos, sin };
}

/**
 * Drop in percent of the nominal voltage for a conductor of `area_m2` with the parsed
 * input's other data (method as chosen). `forceMax` evaluates at θ_max and ignores a given
 * 20 °C resistance (which belongs to the input's own size) — for size searches.
 */
export function feederDropPercent(v: VoltageDropParsed, area_m2: number, forceMax: boolean): number {
  const c = resolveConductor(v, area_m2, forceMax);
  const b = loopFactor(v.system);
  const { cos, sin } = pfAngle(v);
  const U = phaseVoltage(v.system, v.nominalVoltage_V);
  const r = c.r / v.parallel;
  const x = c.x / v.parallel;
  const u = v.method === "approximate" ? voltageDropApprox(b, r, x, v.length_m, v.current_A, cos, sin) : voltageDropExact(b, r, x, v.length_m, v.current_A, cos, sin, U, v.voltageAt === "sending");
  return (100 * u) / U;
}

/** Smallest standard size of the series whose drop (same parallel count) is within `limit_percent`. */
export function smallestSizeMeetingDrop(v: VoltageDropParsed, limit_percent: number, series: SizeSeries): { label: string; area_m2: number; drop_percent: number } | null {
  for (const s of standardSizes(series, material(v.materialId).metal)) {
    const d = feederDropPercent(v, s.area_m2, true);
    if (Number.isFinite(d) && d <= limit_percent) return { label: s.label, area_m2: s.area_m2, drop_percent: d };
  }
  return null;
}

const FORMULAS: Record<string, Formula> = {
  approx: {
    id: "vd-approx",
    expression: "u = b·(ρ1·L/S·cos φ + λ·L·sin φ)·I_B;  Δu = 100·u/U0",
    source: "IEC 60364-5-52:2009 Annex G §G.52.2 (b = 1 three-phase, 2 single-phase/DC; λ = 0.08 mΩ/m when unknown)",
  },
  exactRecv: {
    id: "vd-exact",
    expression: "V_s = V_r + I·Z,  Z = b·L·(r + jx)/n;  ΔV = |V_s| − |V_r| = √((V_r + a)² + c²) − V_r",
    source: "Phasor circuit law for a series impedance feeding a constant-current load (common practice)",
  },
  exactSend: {
    id: "vd-exact",
    expression: "|V_r + I·Z| = |V_s|  ⇒  V_r = √(V_s² − c²) − a,  a = Re(I·Z), c = Im(I·Z);  ΔV = V_s − V_r",
    source: "Phasor circuit law for a series impedance feeding a constant-current load, solved exactly for the receiving end (common practice)",
  },
  rTheta: { id: "r-theta", expression: "R_θ = R_20·(β + θ)/(β + 20)", source: "IEC 60287-1-1:2006 §2.1.1" },
  skin: { id: "skin", expression: "x_s² = 8πf/R'·10⁻⁷·k_s;  y_s = x_s⁴/(192 + 0.8·x_s⁴);  R = R'(1 + y_s)", source: "IEC 60287-1-1:2006 §2.1.2 (k_s = 1, round stranded)" },
  thetaLoad: { id: "theta-load", expression: "θ = θa + (θmax − θa)·(I_B/I_z)²", source: "Common practice (losses ∝ I²); CENELEC CLC/TR 50480 — from memory" },
  limit: {
    id: "vd-limit",
    expression: "Δu_max = Δu_table + min(0.5 %, 0.005 %/m·(L − 100 m)) for L > 100 m",
    source: "IEC 60364-5-52:2009 Annex G Table G.52.1 and its note",
  },
};

export function voltageDrop(input: VoltageDropInput): CalcResult<VoltageDropResults> {
  let v = voltageDropInputSchema.parse(input);
  const warnings: Warning[] = [];
  const formulas: Formula[] = [FORMULAS.approx!];
  let tableUse: FeederAmpacityTableUse | undefined;
  if (v.ampacityFromTable) {
    const t = feederAmpacityFromTable(v, v.ampacityFromTable);
    tableUse = t.use;
    warnings.push(...t.warnings);
    // From here on the table's I_z is the feeder's current-carrying capacity.
    v = { ...v, ampacity_A: t.use.ampacity_A };
    formulas.push(
      { id: "iz-table", expression: "I_z = n·I_tab·k_θ·k_g", source: `${t.use.title}${t.use.source ? ` (${t.use.source})` : ""}, row ${t.use.rowLabel}: ${t.use.row.ampacity_A} A at ${t.use.row.referenceAmbient_C} °C; correction factors applied per IEC 60364-5-52:2009 §523` },
      { id: "k-theta", expression: "k_θ = √((θ_max − θ_a)/(θ_max − θ_ref))", source: "IEC 60364-5-52:2009 Table B.52.14 basis (the factors follow from this formula) — from memory" },
    );
    if (t.use.groupingArrangement)
      formulas.push({ id: "k-group", expression: `k_g = ${t.use.groupingFactor} (${t.use.circuits} circuit(s))`, source: t.use.groupingSource });
  }
  const b = loopFactor(v.system);
  const { cos, sin } = pfAngle(v);
  const U = phaseVoltage(v.system, v.nominalVoltage_V);
  const llFactor = isThreePhase(v.system) ? Math.sqrt(3) : 1;
  const sendingGiven = v.voltageAt === "sending";

  const c = resolveConductor(v, v.area_m2, false);
  const r = c.r / v.parallel;
  const x = c.x / v.parallel;

  const uApprox = voltageDropApprox(b, r, x, v.length_m, v.current_A, cos, sin);
  const uExact = voltageDropExact(b, r, x, v.length_m, v.current_A, cos, sin, U, sendingGiven);
  if (!Number.isFinite(uExact)) {
    throw new EngineError(
      "feeder-collapse",
      `The feeder cannot deliver ${v.current_A} A at ${v.nominalVoltage_V} V over ${v.length_m} m: no receiving-end voltage exists (impedance too high for the current)`,
      "current_A",
    );
  }
  formulas.push(sendingGiven ? FORMULAS.exactSend! : FORMULAS.exactRecv!);
  if (c.basisId === "annex-g") {
    if (v.resistance20_ohm_per_m !== undefined) warnings.push({ code: "r20-ignored", message: "The Annex G resistivity basis uses ρ1 from the standard; the given resistance at 20 °C was not used." });
  } else {
    formulas.push(FORMULAS.rTheta!);
    if (c.basisId === "load") formulas.push(FORMULAS.thetaLoad!);
  }
  if (v.system !== "dc-2w") formulas.push(FORMULAS.skin!);

  const u = v.method === "approximate" ? uApprox : uExact;
  const pct = (d: number) => (100 * d) / U;

  // Phasors (per phase or loop), V_r on the real axis.
  const k = b * v.length_m * v.current_A;
  const a = k * (r * cos + x * sin);
  const cc = k * (x * cos - r * sin);
  const vr = sendingGiven ? Math.sqrt(U * U - cc * cc) - a : U;
  const vsRe = vr + a;
  const vsIm = cc;
  const vs = Math.hypot(vsRe, vsIm);
  const profile: ProfilePoint[] = [];
  for (let i = 0; i < v.profilePoints; i++) {
    const f = i / (v.profilePoints - 1);
    profile.push({ distance_m: f * v.length_m, voltage_V: llFactor * Math.hypot(vsRe - f * a, vsIm - f * cc) });
  }

  const limitRow = voltageDropLimit(v.limitId);
  const lim = applicableLimitPercent(v.limitId, v.length_m);
  const limit_percent = v.limitPercent ?? lim.percent;
  if (v.limitPercent === undefined && lim.supplement > 0) formulas.push(FORMULAS.limit!);
  const drop_percent = pct(u);
  const total = drop_percent + v.upstreamDrop_percent;

  if (v.system !== "dc-2w" && v.reactance_ohm_per_m === undefined)
    warnings.push({ code: "default-reactance", message: "Reactance not given: 0.08 mΩ/m per conductor assumed (IEC 60364-5-52 Annex G)." });
  if (c.basisId !== "annex-g" && c.theta_C > insulationMaxTemperature(v.insulation, v.area_m2) + 1e-9)
    warnings.push({ code: "over-temperature", message: `Conductor temperature ${c.theta_C.toFixed(1)} °C exceeds the ${v.insulation.toUpperCase()} limit: the load exceeds the current-carrying capacity.` });
  if (v.ampacity_A !== undefined && v.current_A > v.ampacity_A)
    warnings.push({ code: "overload", message: `Load current ${v.current_A} A exceeds the current-carrying capacity ${v.ampacity_A} A.` });
  if (c.ys > 0.05 || v.area_m2 > 300e-6)
    warnings.push({ code: "proximity-neglected", message: "Large conductor: the proximity effect (not included) may raise the AC resistance by several percent; give the manufacturer's AC resistance as the 20 °C value scaled, or use the IEC 60287 method." });
  if (drop_percent > 10)
    warnings.push({ code: "large-drop", message: `Drop of ${drop_percent.toFixed(1)} %: the approximate method understates it; the exact result is ${pct(uExact).toFixed(2)} %.` });
  if (v.system !== "dc-2w" && v.powerFactor === 0) warnings.push({ code: "zero-pf", message: "Power factor 0: purely reactive load." });

  const minimumSize = smallestSizeMeetingDrop(v, limit_percent - v.upstreamDrop_percent, v.sizeSeries);
  if (!minimumSize) warnings.push({ code: "no-size", message: `No standard size in the ${v.sizeSeries} series meets the limit with ${v.parallel} in parallel; add parallel conductors.` });

  const results: VoltageDropResults = {
    method: v.method,
    solvedFor: sendingGiven ? "receiving-end voltage (sending end given)" : "sending-end voltage (receiving end given)",
    sendingVoltage_V: llFactor * vs,
    receivingVoltage_V: llFactor * vr,
    drop_V: llFactor * u,
    drop_percent,
    u_V: u,
    dropApprox_V: llFactor * uApprox,
    dropApprox_percent: pct(uApprox),
    dropExact_V: llFactor * uExact,
    dropExact_percent: pct(uExact),
    totalDrop_percent: total,
    conductorTemperature_C: c.theta_C,
    temperatureBasis: c.basis,
    resistance_ohm_per_m: c.r,
    reactance_ohm_per_m: c.x,
    phaseResistance_ohm: r * v.length_m,
    phaseReactance_ohm: x * v.length_m,
    limit_percent,
    limitSource: v.limitPercent !== undefined ? "organisation override" : `${limitRow.name}: ${limitRow.source}`,
    profile,
    minimumSize,
    ...(tableUse ? { tableAmpacity_A: tableUse.ampacity_A, ampacityTable: tableUse } : {}),
  };

  return {
    kind: "voltage-drop",
    engineVersion: ENGINE_VERSION,
    results,
    intermediates: {
      b: q("Loop factor b", b, ""),
      U0: q("Reference voltage U0 (phase for three-phase)", U, "V"),
      theta: q("Conductor temperature", c.theta_C, "°C"),
      r: q("Resistance of one conductor", c.r, "Ω/m"),
      ys: q("Skin-effect factor y_s", c.ys, ""),
      x: q("Reactance of one conductor", c.x, "Ω/m"),
      R: q("Phase resistance over the route", r * v.length_m, "Ω"),
      X: q("Phase reactance over the route", x * v.length_m, "Ω"),
      u: q("Drop u (per phase / loop)", u, "V"),
      limit: q("Limit", limit_percent, "%"),
      ...(tableUse
        ? {
            Itab: q(`Tabulated ampacity I_tab — ${tableUse.title}, ${sizeText(tableUse.row)} ${tableUse.row.material} ${tableUse.row.insulation.toUpperCase()} installation ${tableUse.row.installation}`, tableUse.row.ampacity_A, "A"),
            kTheta: q(`Ambient correction k_θ (θ_a ${v.ambient_C} °C, θ_ref ${tableUse.row.referenceAmbient_C} °C, θ_max ${tableUse.row.conductorMax_C} °C)`, tableUse.ambientFactor, ""),
            kg: q(`Grouping factor k_g (${tableUse.groupingArrangement ? `${GROUPING_FACTORS[tableUse.groupingArrangement as keyof typeof GROUPING_FACTORS].label}, ${tableUse.circuits} circuit(s)` : "no grouping"})`, tableUse.groupingFactor, ""),
            n: q("Conductors in parallel n", v.parallel, ""),
            Iz: q("Current-carrying capacity of the phase I_z", tableUse.ampacity_A, "A"),
          }
        : {}),
    },
    formulas,
    warnings,
    checks: [check("voltage-drop", v.upstreamDrop_percent > 0 ? "Voltage drop incl. upstream" : "Voltage drop", total, limit_percent, "%")],
  };
}
