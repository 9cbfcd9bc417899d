import table from "../../reference-tables/materials.json";

export type SurfaceFinish = "polished" | "oxidised" | "heavily-oxidised" | "painted" | "tinned";
export const SURFACE_FINISHES = ["polished", "oxidised", "heavily-oxidised", "painted", "tinned"] as const;
export type Metal = "copper" | "aluminium";

export interface Temper {
  id: string;
  name: string;
  conductivity_MS_m?: number;
  proofStress_MPa: number;
  source: string;
}

export interface Material {
  id: string;
  name: string;
  metal: Metal;
  resistivity20_ohm_m: number;
  alpha20_per_K: number;
  beta_K: number;
  density_kg_m3: number;
  volumetricHeatCapacity_J_m3K: number;
  thermalConductivity_W_mK: number;
  tempers: Temper[];
  sources: Record<string, string>;
}

export const MATERIALS: readonly Material[] = table.materials as Material[];
export const MATERIAL_IDS = ["cu-annealed", "cu-etp", "cu-hard-drawn", "al-1350", "al-6101"] as const;
export type MaterialId = (typeof MATERIAL_IDS)[number];

export function material(id: string): Material {
  const m = MATERIALS.find((x) => x.id === id);
  if (!m) throw new Error(`unknown material "${id}"; known: ${MATERIALS.map((x) => x.id).join(", ")}`);
  return m;
}

export function temper(m: Material, temperId?: string): Temper {
  if (!temperId) return m.tempers[0]!;
  const t = m.tempers.find((x) => x.id === temperId);
  if (!t) throw new Error(`unknown temper "${temperId}" for ${m.name}; known: ${m.tempers.map((x) => x.id).join(", ")}`);
  return t;
}

/**
 * Resistivity at 20 °C in Ω·m, using the temper's minimum conductivity where the
 * product standard gives one (EN 13601 for Cu-ETP, ASTM B317 for 6101).
 */
export function resistivity20(m: Material, temperId?: string): number {
  const t = temperId ? temper(m, temperId) : undefined;
  return t?.conductivity_MS_m ? 1 / (t.conductivity_MS_m * 1e6) : m.resistivity20_ohm_m;
}

/**
 * Resistivity at θ °C: ρ_θ = ρ_20·(β + θ)/(β + 20) — IEC 60287-1-1:2006 §2.1.1,
 * written with the inferred zero-resistance temperature β = 1/α20 − 20 (IEC 60949 Table I).
 */
export function resistivityAt(m: Material, theta_C: number, temperId?: string): number {
  return resistivity20(m, temperId) * (m.beta_K + theta_C) / (m.beta_K + 20);
}

export function emissivity(metal: Metal, finish: SurfaceFinish): number {
  return (table.emissivity as unknown as Record<Metal, Record<SurfaceFinish, number>>)[metal][finish];
}
