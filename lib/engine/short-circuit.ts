/**
 * Short-circuit withstand of a conductor: peak current, thermal (adiabatic) and
 * mechanical (electromagnetic force, bending stress, support forces) checks.
 */
import limitsTable from "../../reference-tables/insulation-limits.json";
import { material, resistivity20, type Material } from "./materials";

/* ------------------------------------------------------------------ */
/* Insulation temperature limits                                        */
/* ------------------------------------------------------------------ */

export interface InsulationLimit {
  id: string;
  name: string;
  /** Highest conductor temperature in continuous operation, °C. */
  continuous_C: number;
  /** Highest conductor temperature at the end of a short circuit, °C. */
  shortCircuit_C: number;
  /** Printed k factors (A·√s/mm²) of the source table, for cross-checks only. */
  kCu?: number;
  kAl?: number;
  maxSection_mm2?: number;
  minSection_mm2?: number;
  source: string;
}

export const INSULATION_LIMITS: readonly InsulationLimit[] = limitsTable.limits as InsulationLimit[];
export const INSULATION_IDS = [
  "pvc-le300",
  "pvc-gt300",
  "xlpe-epr",
  "rubber-60",
  "mineral-pvc",
  "mineral-bare",
  "bare-busbar",
  "bare-30-200",
  "bare-30-150",
  "bare-30-500",
  "bare-al-30-300",
] as const;
export type InsulationId = (typeof INSULATION_IDS)[number];

export function insulationLimits(id: string): InsulationLimit {
  const l = INSULATION_LIMITS.find((x) => x.id === id);
  if (!l) throw new Error(`unknown insulation "${id}"; known: ${INSULATION_LIMITS.map((x) => x.id).join(", ")}`);
  return l;
}

/* ------------------------------------------------------------------ */
/* Thermal: adiabatic heating                                           */
/* ------------------------------------------------------------------ */

/**
 * K = √[Q_c·(β + 20)/ρ_20] in A·√s/mm² — the material constant of the adiabatic
 * equation, IEC 60364-5-54:2011 Annex A (A.1) / IEC 60949:1988 §3, with Q_c the
 * volumetric heat capacity and ρ_20 the resistivity at 20 °C.
 */
export function adiabaticMaterialConstant(m: Material, temperId?: string): number {
  const K2_SI = (m.volumetricHeatCapacity_J_m3K * (m.beta_K + 20)) / resistivity20(m, temperId); // A²·s/m⁴
  return Math.sqrt(K2_SI) / 1e6; // A·√s/mm²
}

/**
 * k = K·√ln[(β + θ_f)/(β + θ_i)] in A·√s/mm² — IEC 60364-5-54:2011 Annex A (A.1),
 * IEC 60364-4-43:2008 §434.5.2, IEC 60949:1988 eq. (1) (adiabatic, no heat loss).
 */
export function adiabaticK(materialId: string, thetaInitial_C: number, thetaFinal_C: number, temperId?: string): number {
  const m = material(materialId);
  if (!(thetaFinal_C > thetaInitial_C)) throw new Error(`final temperature (${thetaFinal_C} °C) must exceed the initial temperature (${thetaInitial_C} °C)`);
  if (!(m.beta_K + thetaInitial_C > 0)) throw new Error(`initial temperature ${thetaInitial_C} °C is below −β of ${m.name}`);
  return adiabaticMaterialConstant(m, temperId) * Math.sqrt(Math.log((m.beta_K + thetaFinal_C) / (m.beta_K + thetaInitial_C)));
}

/** S = √(I²·t)/k in mm² — IEC 60364-5-54:2011 §543.1.2, IEC 60364-4-43:2008 §434.5.2. */
export function minimumSectionAdiabatic(I_A: number, t_s: number, k: number): number {
  return (I_A * Math.sqrt(t_s)) / k;
}

/** I = k·S/√t in A — the same equation solved for the current a section withstands for t. */
export function withstandCurrentAdiabatic(S_mm2: number, t_s: number, k: number): number {
  return (k * S_mm2) / Math.sqrt(t_s);
}

/**
 * θ_f = (β + θ_i)·exp[I²t/(K²S²)] − β — IEC 60949:1988 eq. (1) solved for the final
 * temperature (adiabatic).
 */
export function finalTemperatureAdiabatic(m: Material, I_A: number, t_s: number, S_mm2: number, thetaInitial_C: number, temperId?: string): number {
  const K = adiabaticMaterialConstant(m, temperId);
  return (m.beta_K + thetaInitial_C) * Math.exp((I_A * I_A * t_s) / (K * K * S_mm2 * S_mm2)) - m.beta_K;
}
