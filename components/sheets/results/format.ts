import { sig } from "@/lib/engine/format";
import { displayValue, type UnitSystem } from "@/lib/sheets/units";

/** A value with its unit in the project's units, to 4 significant figures ("87.26 °C"). */
export function fmt(value: number | null | undefined, unit: string, system: UnitSystem, figures = 4): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  if (!Number.isFinite(value)) return value > 0 ? "∞" : "−∞";
  const d = displayValue(value, unit, system);
  return `${sig(d.value, figures)}${d.unit ? (d.unit.startsWith("%") ? "" : " ") + d.unit : ""}`;
}

/** A margin as a signed percentage ("+12.3 %"). */
export function pct(x: number): string {
  if (!Number.isFinite(x)) return x > 0 ? "∞" : "−∞";
  const s = sig(x * 100, 3);
  return `${x >= 0 ? "+" : ""}${s} %`;
}
