import type { SelectOption } from "@/components/forms/field";
import { MATERIALS } from "@/lib/engine/materials";

/** Choice lists shared by the sheet forms, worded for the user; values are the engine's ids. */
const o = (value: string, label: string): SelectOption => ({ value, label });

export const MATERIAL_OPTIONS: SelectOption[] = MATERIALS.map((m) => o(m.id, m.name));

/** Tempers of a material, with the material's default first ("" = the default temper). */
export function temperOptions(materialId: string): SelectOption[] {
  const m = MATERIALS.find((x) => x.id === materialId);
  if (!m) return [o("", "Default")];
  return [o("", `Default (${m.tempers[0]?.name ?? "first listed"})`), ...m.tempers.map((t) => o(t.id, t.name))];
}

export function temperIsValid(materialId: string, temperId: unknown): boolean {
  if (temperId === undefined || temperId === "" || temperId === null) return true;
  return MATERIALS.find((x) => x.id === materialId)?.tempers.some((t) => t.id === temperId) ?? false;
}

export const FINISH_OPTIONS = [
  o("polished", "Bright (polished)"),
  o("oxidised", "Oxidised (normal service)"),
  o("heavily-oxidised", "Heavily oxidised"),
  o("painted", "Painted (matt)"),
  o("tinned", "Tinned"),
];

export const ORIENTATION_OPTIONS = [o("edge", "On edge (width vertical)"), o("flat", "Flat (width horizontal)")];

export const PHASE_OPTIONS = [o("1", "1 — a single pack"), o("2", "2 — go and return"), o("3", "3 — three-phase")];

export const BARS_PER_PHASE_OPTIONS = [1, 2, 3, 4, 5, 6, 7, 8].map((n) => o(String(n), String(n)));
