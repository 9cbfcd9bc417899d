/**
 * DC and AC resistance of conductors: round solid/stranded, flat bars and bar packs.
 */
import { material, resistivityAt } from "./materials";

/**
 * DC resistance per metre of a conductor of cross-section `area_m2` at θ °C, from the
 * material's resistivity (temper conductivity where the product standard gives one):
 * R_θ = ρ_20·(β + θ)/((β + 20)·A) — IEC 60287-1-1:2006 §2.1.1.
 * No stranding allowance: this is the solid section (a bar, a rod, a solid wire).
 */
export function dcResistancePerMetre(materialId: string, area_m2: number, theta_C: number, temperId?: string): number {
  if (!(area_m2 > 0) || !Number.isFinite(area_m2)) throw new RangeError(`area must be a positive number of m², got ${area_m2}`);
  return resistivityAt(material(materialId), theta_C, temperId) / area_m2;
}
