/**
 * The computation of one schedule row with the engine: the ampacity (given, or looked up
 * in the organisation's table with the ambient and grouping corrections), the conductor
 * temperature at the load current, the voltage drop at that temperature, and the checks.
 * No formula is written here: each comes from lib/engine. Pure.
 */
import { ampacityFromTable, findAmpacityRow, type AmpacityTable } from "@/lib/engine/ampacity-table";
import { insulationMaxTemperature } from "@/lib/engine/cable-ampacity";
import { EngineError } from "@/lib/engine/core/result";
import type { MaterialId } from "@/lib/engine/materials";
import { conductorTemperatureAtLoad, voltageDrop } from "@/lib/engine/voltage-drop";
import { COLUMN_BY_KEY, type ColumnKey } from "./columns";
import type { ScheduleError, ScheduleMetal, ScheduleOptions, ScheduleRowInput, ScheduleRowResult } from "./types";

export interface ComputeContext {
  options: ScheduleOptions;
  /** The organisation table chosen for the upload (rows in SI), or null. */
  table: AmpacityTable | null;
  /** "Name v3", for messages. */
  tableLabel: string | null;
  /** The header of a column as written in the file (for messages). */
  header: (key: ColumnKey) => string;
}

export type ComputeOutcome = { ok: true; result: ScheduleRowResult } | { ok: false; errors: ScheduleError[] };

const MATERIAL_OF: Record<ScheduleMetal, MaterialId> = { copper: "cu-annealed", aluminium: "al-1350" };

/** The engine's conductor-temperature input range (voltage-drop.ts): −40 to 250 °C. */
const ENGINE_THETA = { min: -40, max: 250 };

const fmt = (x: number, digits = 3) => String(Number(x.toPrecision(digits)));

/** θ_max of the insulation from the engine's table (IEC: PVC 70 °C, or 160 … ; XLPE/EPR 90 °C), when it knows the insulation. */
function insulationLimit(insulation: string, area_m2: number): number | undefined {
  if (insulation === "pvc") return insulationMaxTemperature("pvc", area_m2);
  if (insulation === "xlpe" || insulation === "epr") return insulationMaxTemperature("xlpe", area_m2);
  return undefined;
}

export function computeRow(r: ScheduleRowInput, ctx: ComputeContext): ComputeOutcome {
  const err = (key: ColumnKey | "", message: string): ComputeOutcome => {
    const column = key ? ctx.header(key) : "";
    return { ok: false, errors: [{ row: r.row, column, message: column ? `Row ${r.row}, column "${column}": ${message}` : `Row ${r.row}: ${message}` }] };
  };
  const warnings: string[] = [];
  const ambient = r.ambient_C ?? ctx.options.defaultAmbient_C;
  const mm2 = `${fmt(r.size_m2 * 1e6, 4)} mm²`;

  // Ampacity of one conductor.
  let each: number;
  let source: ScheduleRowResult["ampacitySource"];
  let tabulated: number | null = null;
  let ka: number | null = null;
  let kg: number | null = null;
  let thetaMax: number | undefined;
  if (r.ampacityGiven_A !== null) {
    each = r.ampacityGiven_A;
    source = "given";
    if (r.installation) warnings.push(`The ampacity was given, so installation method "${r.installation}" was not looked up.`);
    if (r.grouping !== null) warnings.push("A grouping factor applies to a table ampacity only; the given ampacity was used as it is.");
  } else if (r.installation) {
    if (!ctx.table)
      return err("installation", `no ampacity table was chosen for this upload, so installation method "${r.installation}" cannot be looked up: choose one of the organisation's tables, or give the ampacity.`);
    const row = findAmpacityRow(ctx.table, r.size_m2, r.material, r.insulation, r.installation);
    if (!row)
      return err("installation", `table ${ctx.tableLabel} has no row for ${mm2} (${r.sizeLabel}) ${r.material} ${r.insulation} in installation method "${r.installation}".`);
    try {
      // One-row table: the row is already found; the engine applies the corrections.
      const out = ampacityFromTable({
        table: { name: ctx.table.name, rows: [row] },
        size_m2: row.size_m2,
        material: r.material,
        insulation: r.insulation as (typeof row)["insulation"],
        installation: r.installation,
        ambient_C: ambient,
        ...(r.grouping !== null ? { groupingFactor: r.grouping } : {}),
      });
      each = out.results.corrected_A;
      tabulated = out.results.tabulated_A;
      ka = out.results.ambientFactor;
      kg = out.results.groupingFactor;
      thetaMax = row.conductorMax_C;
      for (const w of out.warnings) warnings.push(w.message);
    } catch (e) {
      if (e instanceof EngineError) return err("installation", e.message);
      return err("ambient", `the table lookup refused the ambient ${fmt(ambient)} °C (−40 to 80 °C).`);
    }
    source = "table";
  } else {
    return err(
      "",
      `no ampacity: give one in the "${ctx.header("ampacity")}" column, or fill "${ctx.header("installation")}" and choose an organisation ampacity table for the upload.`,
    );
  }

  // Maximum conductor temperature: the table row's, the file's, or the insulation's.
  if (thetaMax === undefined) thetaMax = r.maxTemperature_C ?? insulationLimit(r.insulation, r.size_m2);
  if (thetaMax === undefined)
    return err("maxTemperature", `is needed for insulation "${r.insulation}" (40 to 250 °C): only pvc, xlpe and epr have a known limit.`);
  if (ambient >= thetaMax)
    return err(r.ambient_C === null ? "" : "ambient", `ambient ${fmt(ambient)} °C${r.ambient_C === null ? " (the project's design ambient)" : ""} is at or above the maximum conductor temperature ${fmt(thetaMax)} °C: no current can be carried.`);
  if (!(each > 0)) return err(source === "table" ? "installation" : "ampacity", "the ampacity comes to 0 A after the corrections: no current can be carried.");

  const ampacity = each * r.parallel;
  const utilisation = r.current_A / ampacity;
  const theta = conductorTemperatureAtLoad(ambient, thetaMax, r.current_A, ampacity);
  const thetaForDrop = Math.min(ENGINE_THETA.max, Math.max(ENGINE_THETA.min, theta));
  if (thetaForDrop !== theta) warnings.push(`Conductor temperature ${fmt(theta)} °C is beyond the 250 °C the resistance model takes: the drop was computed at 250 °C.`);

  let drop;
  try {
    drop = voltageDrop({
      system: r.system,
      nominalVoltage_V: r.voltage_V,
      voltageAt: "sending",
      current_A: r.current_A,
      powerFactor: r.powerFactor ?? 1,
      frequency_Hz: ctx.options.frequency_Hz,
      length_m: r.length_m,
      materialId: MATERIAL_OF[r.material],
      area_m2: r.size_m2,
      parallel: r.parallel,
      insulation: r.insulation === "pvc" ? "pvc" : "xlpe",
      ambient_C: Math.min(80, Math.max(-40, ambient)),
      temperatureBasis: "given",
      conductorTemperature_C: thetaForDrop,
      method: "exact",
      limitId: ctx.options.limitId,
      ...(ctx.options.limitPercent !== undefined ? { limitPercent: ctx.options.limitPercent } : {}),
      sizeSeries: r.sizeSeries,
      profilePoints: 2,
    });
  } catch (e) {
    if (e instanceof EngineError) return err("current", `${e.message}.`);
    const message = e instanceof Error ? e.message : String(e);
    return err("", `the voltage drop could not be computed: ${message.slice(0, 200)}`);
  }
  const res = drop.results;
  for (const w of drop.warnings) if (w.code === "large-drop" || w.code === "proximity-neglected") warnings.push(w.message);

  const reasons: string[] = [];
  if (res.drop_percent > res.limit_percent) reasons.push(`Voltage drop ${fmt(res.drop_percent)} % exceeds the ${fmt(res.limit_percent)} % limit`);
  if (r.current_A > ampacity) reasons.push(`Load ${fmt(r.current_A)} A exceeds the ampacity ${fmt(ampacity)} A (${fmt(utilisation * 100)} % used)`);
  if (theta > thetaMax + 1e-9) reasons.push(`Conductor temperature ${fmt(theta)} °C exceeds the ${fmt(thetaMax)} °C limit`);

  return {
    ok: true,
    result: {
      row: r.row,
      tag: r.tag,
      from: r.from,
      to: r.to,
      material: r.material,
      insulation: r.insulation,
      sizeText: r.sizeText,
      sizeLabel: r.sizeLabel,
      size_m2: r.size_m2,
      parallel: r.parallel,
      length_m: r.length_m,
      current_A: r.current_A,
      powerFactor: r.powerFactor,
      system: r.system,
      voltage_V: r.voltage_V,
      installation: r.installation,
      ambient_C: ambient,
      ambientFromProject: r.ambient_C === null,
      ampacityGiven_A: r.ampacityGiven_A,
      grouping: r.grouping,
      ampacitySource: source,
      tabulated_A: tabulated,
      ambientFactor: ka,
      groupingFactor: kg,
      ampacity_A: ampacity,
      utilisation,
      thetaMax_C: thetaMax,
      conductorTemperature_C: theta,
      drop_V: res.drop_V,
      drop_percent: res.drop_percent,
      limit_percent: res.limit_percent,
      minimumSize: res.minimumSize?.label ?? null,
      pass: reasons.length === 0,
      reasons,
      warnings,
    },
  };
}

/** The header text of a column in a file, or the column's own name when the file has no such column. */
export function headerLookup(columns: readonly { key: ColumnKey; header: string }[]): (key: ColumnKey) => string {
  const m = new Map(columns.map((c) => [c.key, c.header] as const));
  return (key) => m.get(key) ?? COLUMN_BY_KEY[key].name;
}
