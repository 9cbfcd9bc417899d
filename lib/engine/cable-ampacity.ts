/**
 * Current rating of 0.6/1 kV cables in free air (shielded from solar radiation), 100 % load
 * factor, by IEC 60287-1-1:2006 §1.4.1.1 and IEC 60287-2-1:2015 §4:
 *
 *   I = √{(Δθ − W_d[0.5·T1 + n(T2 + T3 + T4)]) / (R·T1 + n·R(1 + λ1)·T2 + n·R(1 + λ1 + λ2)(T3 + T4))}
 *
 * LV simplifications, stated in every result: dielectric losses W_d = 0 (IEC 60287-1-1 §2.2
 * requires them only above the voltages of its Table 3, none of which is LV); no metallic
 * sheath or armour, so λ1 = λ2 = 0 and T2 = 0.
 */
import { z } from "zod";
import { ENGINE_VERSION, q, type CalcResult, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";
import { material, MATERIAL_IDS, resistivity20, type Material } from "./materials";
import constructions from "../../reference-tables/cable-constructions.json";
import { iec60228MaxResistance } from "./conductors";
import { iecProximityFactor, iecSkinFactor, iecX, SKIN_PROXIMITY_FACTORS } from "./resistance";
import insulationTable from "../../reference-tables/insulation-limits.json";

export const CABLE_INSULATIONS = ["pvc", "xlpe"] as const;
export type CableInsulation = (typeof CABLE_INSULATIONS)[number];

/** Continuous conductor temperature limit, °C, from reference-tables/insulation-limits.json. */
export function insulationMaxTemperature(insulation: CableInsulation, area_m2?: number): number {
  const id = insulation === "xlpe" ? "xlpe-epr" : area_m2 !== undefined && area_m2 > 300e-6 ? "pvc-gt300" : "pvc-le300";
  const row = insulationTable.limits.find((l) => l.id === id);
  if (!row) throw new Error(`insulation limit "${id}" missing from insulation-limits.json`);
  return row.continuous_C;
}

// ---------------------------------------------------------------------------------------
// AC resistance (IEC 60287-1-1 §2.1)
// ---------------------------------------------------------------------------------------

/**
 * Skin-effect factor y_s of a round stranded conductor with extruded insulation,
 * IEC 60287-1-1:2006 §2.1.2 with k_s = 1 (Table 2).
 */
export function skinEffectFactor(rdc_ohm_per_m: number, frequency_Hz: number): number {
  if (!(frequency_Hz > 0)) return 0;
  return iecSkinFactor(iecX(frequency_Hz, rdc_ohm_per_m, SKIN_PROXIMITY_FACTORS.stranded.ks));
}

/**
 * Proximity-effect factor y_p, IEC 60287-1-1:2006 §2.1.4 with k_p = 1 (round stranded,
 * extruded insulation, Table 2): two loaded conductors use the two-core form, three the
 * three-core / three single-core form; one loaded conductor has none.
 */
export function proximityEffectFactor(rdc_ohm_per_m: number, frequency_Hz: number, dc_m: number, s_m: number, loaded: number): number {
  if (!(frequency_Hz > 0) || loaded < 2) return 0;
  const xp = iecX(frequency_Hz, rdc_ohm_per_m, SKIN_PROXIMITY_FACTORS.stranded.kp);
  return iecProximityFactor(xp, dc_m, s_m, loaded === 2 ? "two-core" : "three-core");
}

// ---------------------------------------------------------------------------------------
// Construction
// ---------------------------------------------------------------------------------------

function tableLookup(sizes: readonly number[], values: readonly number[], area_mm2: number): number | undefined {
  const i = sizes.findIndex((s) => Math.abs(s - area_mm2) < 1e-6 * Math.max(1, s));
  if (i < 0) return undefined;
  const v = values[i];
  return v;
}

/** Nominal insulation thickness, m, for a standard size (IEC 60502-1, 0.6/1 kV — from memory); undefined for other sizes. */
export function insulationThickness(insulation: CableInsulation, area_m2: number): number | undefined {
  const t = constructions.insulationThickness_mm;
  const v = tableLookup(t.sizes_mm2, t[insulation], area_m2 * 1e6);
  return v === undefined ? undefined : v * 1e-3;
}

/** Maximum resistance at 20 °C, Ω/m, of a class 2 stranded conductor (IEC 60228 Table 2); undefined for other sizes. */
export function iec60228Resistance20(metal: Material["metal"], area_m2: number): number | undefined {
  return iec60228MaxResistance(area_m2 * 1e6, 2, metal)?.maxResistance20_ohm_m;
}

function roundTo01mm(x_m: number): number {
  return Math.round(x_m * 1e4) / 1e4;
}

export interface CableConstruction {
  cores: number;
  conductorDiameter_m: number;
  insulationThickness_m: number;
  /** Diameter over the laid-up cores (multi-core) or over the insulation (single-core). */
  diameterUnderCovering_m: number;
  /** Inner covering (multi-core) plus oversheath thickness. */
  coveringThickness_m: number;
  overallDiameter_m: number;
  rhoInsulation_Km_W: number;
  rhoCovering_Km_W: number;
  sources: string[];
}

export interface ConstructionOverrides {
  conductorDiameter_m?: number;
  insulationThickness_m?: number;
  sheathThickness_m?: number;
}

/**
 * Builds the construction of a non-armoured PVC-sheathed cable from the standards' rules:
 * round conductor diameter from the fill factor, insulation thickness by size (IEC 60502-1),
 * lay-up of n cores, extruded inner covering (multi-core) and oversheath t = 0.035·D + 1.0 mm.
 */
export function cableConstruction(insulation: CableInsulation, area_m2: number, cores: number, o: ConstructionOverrides = {}): CableConstruction {
  const area_mm2 = area_m2 * 1e6;
  const fill = area_mm2 >= constructions.fillFactor.compactedFrom_mm2 ? constructions.fillFactor.compacted : constructions.fillFactor.nonCompacted;
  const dc = o.conductorDiameter_m ?? Math.sqrt((4 * area_m2) / (Math.PI * fill));
  const t1 = o.insulationThickness_m ?? insulationThickness(insulation, area_m2) ?? interpolateInsulation(insulation, area_mm2);
  const coreD = dc + 2 * t1;
  let under = coreD;
  let inner = 0;
  if (cores > 1) {
    const f = (constructions.layUpFactor as unknown as Record<string, number>)[String(cores)];
    if (f === undefined) throw new RangeError(`no lay-up factor for ${cores} cores`);
    under = f * coreD;
    const ic = constructions.innerCovering;
    const idx = ic.overLaidUpDiameter_mm.findIndex((d) => under * 1e3 <= d);
    inner = (idx < 0 ? ic.thickness_mm[ic.thickness_mm.length - 1]! : ic.thickness_mm[idx]!) * 1e-3;
  }
  const sh = constructions.sheath;
  const dUnderSheath = under + 2 * inner;
  const ts = o.sheathThickness_m ?? Math.max(cores > 1 ? sh.minMultiCore_mm * 1e-3 : sh.minSingleCore_mm * 1e-3, roundTo01mm(sh.a * dUnderSheath + sh.b_mm * 1e-3));
  const rho = constructions.thermalResistivity_Km_W;
  const src = constructions.sources;
  return {
    cores,
    conductorDiameter_m: dc,
    insulationThickness_m: t1,
    diameterUnderCovering_m: under,
    coveringThickness_m: inner + ts,
    overallDiameter_m: dUnderSheath + 2 * ts,
    rhoInsulation_Km_W: insulation === "pvc" ? rho["pvc-insulation"] : rho["xlpe-insulation"],
    rhoCovering_Km_W: rho["pvc-sheath"],
    sources: [src["IEC60287-2-1-T1"], src["IEC60502-1-ins"], src["IEC60502-1-sheath"], ...(cores > 1 ? [src["IEC60502-1-inner"], src.layup] : []), src.fill],
  };
}

/** Thickness for a non-standard size: the next larger tabulated size's value (conservative for T1). */
function interpolateInsulation(insulation: CableInsulation, area_mm2: number): number {
  const t = constructions.insulationThickness_mm;
  const i = t.sizes_mm2.findIndex((s) => s >= area_mm2);
  const arr = t[insulation];
  return (i < 0 ? arr[arr.length - 1]! : arr[i]!) * 1e-3;
}

// ---------------------------------------------------------------------------------------
// External thermal resistance in free air (IEC 60287-2-1 §4.2.1)
// ---------------------------------------------------------------------------------------

export const FREE_AIR_ARRANGEMENTS = ["single", "trefoil", "flat-touching", "vertical-touching", "vertical-spaced", "wall-single", "wall-trefoil"] as const;
export type FreeAirArrangement = (typeof FREE_AIR_ARRANGEMENTS)[number];

/**
 * Constants Z, E, g of h = Z/(D_e*)^g + E, IEC 60287-2-1:2015 Table 2 (Table 3 of the 2023
 * edition). Single, trefoil and flat touching are the values the standard prints for its
 * installations 1, 3 and 4; the others from memory.
 */
export const FREE_AIR_CONSTANTS: Record<FreeAirArrangement, { Z: number; E: number; g: number; label: string; cables: number; fromMemory: boolean }> = {
  single: { Z: 0.21, E: 3.94, g: 0.6, label: "single cable in free air", cables: 1, fromMemory: false },
  trefoil: { Z: 0.96, E: 1.25, g: 0.2, label: "three cables in trefoil", cables: 3, fromMemory: false },
  "flat-touching": { Z: 0.62, E: 1.95, g: 0.25, label: "three cables touching, horizontal", cables: 3, fromMemory: false },
  "vertical-touching": { Z: 1.61, E: 0.42, g: 0.2, label: "three cables touching, vertical", cables: 3, fromMemory: true },
  "vertical-spaced": { Z: 1.31, E: 2.0, g: 0.2, label: "three cables spaced D_e, vertical", cables: 3, fromMemory: true },
  "wall-single": { Z: 1.69, E: 0.63, g: 0.25, label: "single cable against a wall", cables: 1, fromMemory: true },
  "wall-trefoil": { Z: 0.94, E: 0.79, g: 0.2, label: "three cables in trefoil against a wall", cables: 3, fromMemory: true },
};

/** Heat dissipation coefficient h, W/(m²·K^(5/4)), IEC 60287-2-1 §4.2.1.1. D_e in metres. */
export function heatDissipationCoefficient(arrangement: FreeAirArrangement, De_m: number): number {
  const k = FREE_AIR_CONSTANTS[arrangement];
  return k.Z / Math.pow(De_m, k.g) + k.E;
}

/**
 * Iteration of IEC 60287-2-1 §4.2.1.2 for the cable surface temperature rise:
 *   (Δθ_s)^¼ₙ₊₁ = [(Δθ + Δθ_d)/(1 + K_A·(Δθ_s)^¼ₙ)]^¼, starting from (Δθ_s)^¼ = 2,
 *   K_A = π·D_e*·h/(1 + λ1 + λ2)·[T1/n + T2(1 + λ1) + T3(1 + λ1 + λ2)]  (here λ = 0, T2 = 0).
 * The standard stops at a change ≤ 0.001; this runs to 1e-12 (at most 200 steps).
 */
export function surfaceRiseFourthRoot(deltaTheta_K: number, KA: number): { value: number; iterations: number } {
  let s = 2;
  for (let i = 1; i <= 200; i++) {
    const next = Math.pow(deltaTheta_K / (1 + KA * s), 0.25);
    if (Math.abs(next - s) < 1e-12) return { value: next, iterations: i };
    s = next;
  }
  return { value: s, iterations: 200 };
}

// ---------------------------------------------------------------------------------------
// Rating
// ---------------------------------------------------------------------------------------

export const cableAmpacityInputSchema = z.object({
  materialId: choice("Conductor material", MATERIAL_IDS).default("cu-annealed"),
  area_m2: num("Conductor cross-section", "m²", 0, 0.002, { exclusiveMin: true }),
  insulation: choice("Insulation", CABLE_INSULATIONS).default("xlpe"),
  /** Cores in one cable (1 = single-core). */
  cores: int("Cores per cable", 1, 5).default(1),
  /** Load-carrying conductors n in one cable (multi-core); 1 for single-core. */
  loadedConductors: int("Loaded conductors per cable", 1, 4).optional(),
  arrangement: choice("Arrangement in air", FREE_AIR_ARRANGEMENTS).default("single"),
  ambient_C: num("Ambient air temperature", "°C", -40, 80).default(30),
  frequency_Hz: num("Frequency", "Hz", 0, 1000).default(50),
  thetaMax_C: num("Maximum conductor temperature", "°C", 40, 250).optional(),
  resistance20_ohm_per_m: num("Conductor resistance at 20 °C", "Ω/m", 0, 1, { exclusiveMin: true }).optional(),
  conductorDiameter_m: num("Conductor diameter", "m", 0, 0.1, { exclusiveMin: true }).optional(),
  insulationThickness_m: num("Insulation thickness", "m", 0, 0.02, { exclusiveMin: true }).optional(),
  sheathThickness_m: num("Sheath thickness", "m", 0, 0.02, { exclusiveMin: true }).optional(),
});

export type CableAmpacityInput = z.input<typeof cableAmpacityInputSchema>;
export type CableAmpacityParsed = z.output<typeof cableAmpacityInputSchema>;

export interface CableAmpacityResults {
  ampacity_A: number;
  thetaMax_C: number;
  /** AC resistance of one conductor at θ_max, Ω/m. */
  resistanceAC_ohm_per_m: number;
  resistanceDC_ohm_per_m: number;
  ys: number;
  yp: number;
  T1_Km_W: number;
  T3_Km_W: number;
  T4_Km_W: number;
  h_W_m2K125: number;
  surfaceRise_K: number;
  /** Losses of one conductor at the rated current, W/m. */
  conductorLoss_W_m: number;
  loadedConductors: number;
  construction: CableConstruction;
  iterations: number;
}

interface Model {
  v: CableAmpacityParsed;
  m: Material;
  n: number;
  thetaMax: number;
  con: CableConstruction;
  r20: number;
  T1: number;
  T3: number;
  h: number;
  De: number;
  fromTable: boolean;
}

function buildModel(v: CableAmpacityParsed): Model {
  const m = material(v.materialId);
  const n = v.cores === 1 ? 1 : Math.min(v.cores, v.loadedConductors ?? 3);
  const thetaMax = v.thetaMax_C ?? insulationMaxTemperature(v.insulation, v.area_m2);
  const con = cableConstruction(v.insulation, v.area_m2, v.cores, v);
  const tabulated = iec60228Resistance20(m.metal, v.area_m2);
  const r20 = v.resistance20_ohm_per_m ?? tabulated ?? resistivity20(m) / v.area_m2;
  // IEC 60287-2-1 §4.1.2.1: T1 = ρ_T/(2π)·ln(1 + 2t1/d_c), applied core by core for multi-core cables.
  const T1 = (con.rhoInsulation_Km_W / (2 * Math.PI)) * Math.log(1 + (2 * con.insulationThickness_m) / con.conductorDiameter_m);
  // IEC 60287-2-1 §4.1.4.1: T3 = ρ_T/(2π)·ln(1 + 2t3/D_a').
  const T3 = (con.rhoCovering_Km_W / (2 * Math.PI)) * Math.log(1 + (2 * con.coveringThickness_m) / con.diameterUnderCovering_m);
  const De = con.overallDiameter_m;
  const h = heatDissipationCoefficient(v.arrangement, De);
  return { v, m, n, thetaMax, con, r20, T1, T3, h, De, fromTable: v.resistance20_ohm_per_m === undefined && tabulated !== undefined };
}

/** AC resistance of one conductor at θ, Ω/m, with y_s and y_p (IEC 60287-1-1 §2.1). */
function acResistance(md: Model, theta_C: number): { rac: number; rdc: number; ys: number; yp: number } {
  const rdc = (md.r20 * (md.m.beta_K + theta_C)) / (md.m.beta_K + 20);
  const f = md.v.frequency_Hz;
  const ys = skinEffectFactor(rdc, f);
  // Axial spacing s: centre distance of touching cores (multi-core) or touching cables (single-core groups).
  const loaded = md.v.cores === 1 ? (FREE_AIR_CONSTANTS[md.v.arrangement].cables === 3 ? 3 : 1) : md.n;
  const s = md.v.cores === 1 ? md.De * (md.v.arrangement === "vertical-spaced" ? 2 : 1) : md.con.conductorDiameter_m + 2 * md.con.insulationThickness_m;
  const yp = proximityEffectFactor(rdc, f, md.con.conductorDiameter_m, s, loaded);
  return { rac: rdc * (1 + ys + yp), rdc, ys, yp };
}

/**
 * Conductor temperature at a given current in free air, by solving the same heat balance:
 * θ − θ_a = W_c·(T1 + n·T3) + Δθ_s with Δθ_s = (n·W_c/(π·D_e·h))^(4/5) (IEC 60287-2-1 §4.2.1:
 * T4 = 1/(π·D_e·h·Δθ_s^¼) ⇒ Δθ_s^(5/4) = n·W_c/(π·D_e·h)), W_c = I²·R(θ). Fixed point in θ.
 */
export function conductorTemperatureInAir(input: CableAmpacityInput, current_A: number): number {
  const md = buildModel(cableAmpacityInputSchema.parse(input));
  const ta = md.v.ambient_C;
  let theta = ta;
  for (let i = 0; i < 500; i++) {
    const Wc = current_A * current_A * acResistance(md, theta).rac;
    const dts = Math.pow((md.n * Wc) / (Math.PI * md.De * md.h), 0.8);
    const next = ta + Wc * (md.T1 + md.n * md.T3) + dts;
    if (Math.abs(next - theta) < 1e-10) return next;
    if (next > 2000) return Number.POSITIVE_INFINITY;
    theta = next;
  }
  return theta;
}

const FORMULAS: Formula[] = [
  {
    id: "rating",
    expression: "I = √{(Δθ − W_d[0.5T1 + n(T2+T3+T4)]) / (R·T1 + nR(1+λ1)T2 + nR(1+λ1+λ2)(T3+T4))};  here W_d = 0, λ1 = λ2 = 0, T2 = 0",
    source: "IEC 60287-1-1:2006 §1.4.1.1",
  },
  { id: "rac", expression: "R = R'(1 + y_s + y_p), R' = R_20(β + θ_max)/(β + 20)", source: "IEC 60287-1-1:2006 §2.1, §2.1.1" },
  { id: "ys", expression: "y_s = x_s⁴/(192 + 0.8x_s⁴), x_s² = 8πf·10⁻⁷·k_s/R'", source: "IEC 60287-1-1:2006 §2.1.2" },
  { id: "yp", expression: "y_p = F(x_p)(d_c/s)²[0.312(d_c/s)² + 1.18/(F(x_p) + 0.27)]", source: "IEC 60287-1-1:2006 §2.1.4.1" },
  { id: "T1", expression: "T1 = ρ_T/(2π)·ln(1 + 2t1/d_c)", source: "IEC 60287-2-1:2015 §4.1.2.1" },
  { id: "T3", expression: "T3 = ρ_T/(2π)·ln(1 + 2t3/D_a')", source: "IEC 60287-2-1:2015 §4.1.4.1" },
  { id: "T4", expression: "T4 = 1/(π·D_e*·h·(Δθ_s)^¼),  h = Z/(D_e*)^g + E", source: "IEC 60287-2-1:2015 §4.2.1.1, Table 2" },
  { id: "dts", expression: "(Δθ_s)^¼ₙ₊₁ = [Δθ/(1 + K_A(Δθ_s)^¼ₙ)]^¼,  K_A = π·D_e*·h·(T1/n + T3)", source: "IEC 60287-2-1:2015 §4.2.1.2" },
];

export function cableAmpacity(input: CableAmpacityInput): CalcResult<CableAmpacityResults> {
  const v = cableAmpacityInputSchema.parse(input);
  const md = buildModel(v);
  const warnings: Warning[] = [
    { code: "lv-simplification", message: "LV cable: dielectric losses neglected (IEC 60287-1-1 §2.2) and no metallic sheath or armour (λ1 = λ2 = 0, T2 = 0)." },
    { code: "no-solar", message: "Cables shaded from direct solar radiation (IEC 60287-2-1 §4.2.1)." },
  ];
  if (v.cores > 1)
    warnings.push({
      code: "multicore-T1",
      message: "Multi-core cable: T1 taken core by core as for a single core and the inner covering and sheath in T3; the geometric factor for belted cables (IEC 60287-2-1 §4.1.2.2) is not applied, and conductors are taken as circular (not sector-shaped).",
    });
  if (v.cores > 1 && v.loadedConductors !== undefined && v.loadedConductors > v.cores)
    warnings.push({ code: "loaded-gt-cores", message: `Loaded conductors (${v.loadedConductors}) exceed the cores (${v.cores}); ${v.cores} used.` });
  if (v.cores === 1 && v.loadedConductors !== undefined && v.loadedConductors !== 1)
    warnings.push({ code: "single-core-n", message: "Single-core cable: n = 1 (one conductor per cable)." });
  const k = FREE_AIR_CONSTANTS[v.arrangement];
  if (k.fromMemory) warnings.push({ code: "zeg-from-memory", message: `Z, E, g for "${k.label}" are from memory (IEC 60287-2-1 Table 2).` });
  if (v.cores > 1 && k.cables === 3) warnings.push({ code: "group-of-multicore", message: "Three multi-core cables in a group: each cable carries the same losses (IEC 60287-2-1 §4.2.1)." });
  if (insulationThickness(v.insulation, v.area_m2) === undefined && v.insulationThickness_m === undefined)
    warnings.push({ code: "non-standard-size", message: "Non-standard size: insulation thickness taken from the next larger standard size." });
  if (!md.fromTable && v.resistance20_ohm_per_m === undefined)
    warnings.push({ code: "r20-from-resistivity", message: "Resistance at 20 °C from the material resistivity and the nominal section (no IEC 60228 value for this size)." });
  const n = md.n;
  const dTheta = md.thetaMax - v.ambient_C;
  if (dTheta <= 0) {
    warnings.push({ code: "ambient-above-limit", message: `Ambient ${v.ambient_C} °C is not below the conductor limit ${md.thetaMax} °C: no current can be carried.` });
  }
  const { rac, rdc, ys, yp } = acResistance(md, md.thetaMax);
  if (v.frequency_Hz > 0 && iecX(v.frequency_Hz, rdc, 1) > 2.8) warnings.push({ code: "skin-validity", message: "x_s > 2.8: outside the validity of the skin-effect formula of IEC 60287-1-1 §2.1.2." });

  let I = 0;
  let T4 = Number.NaN;
  let dts = 0;
  let iterations = 0;
  if (dTheta > 0) {
    const KA = Math.PI * md.De * md.h * (md.T1 / n + md.T3);
    const it = surfaceRiseFourthRoot(dTheta, KA);
    iterations = it.iterations;
    dts = it.value ** 4;
    T4 = 1 / (Math.PI * md.De * md.h * it.value);
    I = Math.sqrt(dTheta / (rac * md.T1 + n * rac * (md.T3 + T4)));
  }

  const results: CableAmpacityResults = {
    ampacity_A: I,
    thetaMax_C: md.thetaMax,
    resistanceAC_ohm_per_m: rac,
    resistanceDC_ohm_per_m: rdc,
    ys,
    yp,
    T1_Km_W: md.T1,
    T3_Km_W: md.T3,
    T4_Km_W: T4,
    h_W_m2K125: md.h,
    surfaceRise_K: dts,
    conductorLoss_W_m: I * I * rac,
    loadedConductors: n,
    construction: md.con,
    iterations,
  };
  return {
    kind: "cable-ampacity",
    engineVersion: ENGINE_VERSION,
    results,
    intermediates: {
      dc: q("Conductor diameter d_c", md.con.conductorDiameter_m, "m"),
      t1: q("Insulation thickness t1", md.con.insulationThickness_m, "m"),
      t3: q("Covering thickness t3", md.con.coveringThickness_m, "m"),
      De: q("Overall diameter D_e", md.De, "m"),
      R20: q("Conductor resistance at 20 °C", md.r20, "Ω/m"),
      R: q("AC resistance at θ_max", rac, "Ω/m"),
      ys: q("Skin-effect factor y_s", ys, ""),
      yp: q("Proximity-effect factor y_p", yp, ""),
      T1: q("T1", md.T1, "K·m/W"),
      T3: q("T3", md.T3, "K·m/W"),
      h: q("Heat dissipation coefficient h", md.h, "W/(m²·K^1.25)"),
      T4: q("T4", T4, "K·m/W"),
      dts: q("Surface temperature rise Δθ_s", dts, "K"),
      n: q("Loaded conductors n", n, ""),
    },
    formulas: FORMULAS,
    warnings,
    checks: [],
  };
}
