/**
 * CSV out: the results of a schedule (the input columns in SI, readable again as a
 * schedule, then the computed columns) and the blank template. Every cell that starts
 * with =, +, -, @, a tab or a carriage return gets a leading single quote, so that a
 * spreadsheet does not run it as a formula; rows.ts takes that quote off on re-import.
 * UTF-8 with a byte order mark (spreadsheets then read °, ² and µ right). Pure.
 */
import Papa from "papaparse";
import type { ScheduleRowResult } from "./types";

const BOM = "\uFEFF";

/** 12 significant digits: a re-import reads back the stored value to 1e-12. */
export function csvNumber(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "";
  const r = Number(x.toPrecision(12));
  return String(Object.is(r, -0) ? 0 : r);
}

/** The neutralising rule, also applied by papaparse's escapeFormulae to string cells. */
export const FORMULA_START = /^[=+\-@\t\r]/;

export function neutraliseCell(cell: string): string {
  return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

/** Rows of string cells → CSV text (comma, CRLF, quotes where needed, formulas neutralised). */
export function toCsv(header: readonly string[], rows: readonly (readonly string[])[]): string {
  // Every cell is a string, so escapeFormulae applies to all of them (it skips numbers).
  return BOM + Papa.unparse({ fields: [...header], data: rows.map((r) => [...r]) }, { escapeFormulae: FORMULA_START, newline: "\r\n", quotes: false });
}

export const EXPORT_INPUT_HEADER = [
  "tag",
  "from",
  "to",
  "material",
  "insulation",
  "size (mm²)",
  "number in parallel",
  "length (m)",
  "load current (A)",
  "power factor",
  "system",
  "voltage (V)",
  "installation method",
  "ampacity (A)",
  "ambient (°C)",
  "grouping factor",
  "max conductor temperature (°C)",
] as const;

/** Computed columns; none of their names is a schedule column, so a re-import ignores them. */
export const EXPORT_RESULT_HEADER = [
  "ambient used (°C)",
  "ampacity source",
  "Iz circuit (A)",
  "utilisation (%)",
  "θmax used (°C)",
  "conductor temperature at load (°C)",
  "drop (V)",
  "drop (%)",
  "drop limit (%)",
  "result",
  "reasons",
  "smallest size meeting the drop",
  "warnings",
  "file row",
] as const;

function sizeCell(r: ScheduleRowResult): string {
  return r.sizeLabel.endsWith(" mm²") ? csvNumber(r.size_m2 * 1e6) : r.sizeLabel;
}

/** The schedule's results as CSV. */
export function resultsCsv(rows: readonly ScheduleRowResult[]): string {
  const data = rows.map((r) => [
    r.tag,
    r.from,
    r.to,
    r.material,
    r.insulation,
    sizeCell(r),
    String(r.parallel),
    csvNumber(r.length_m),
    csvNumber(r.current_A),
    csvNumber(r.powerFactor),
    r.system,
    csvNumber(r.voltage_V),
    r.installation,
    csvNumber(r.ampacityGiven_A),
    r.ambientFromProject ? "" : csvNumber(r.ambient_C),
    csvNumber(r.grouping),
    r.ampacitySource === "given" ? csvNumber(r.thetaMax_C) : "",
    csvNumber(r.ambient_C),
    r.ampacitySource,
    csvNumber(r.ampacity_A),
    csvNumber(r.utilisation * 100),
    csvNumber(r.thetaMax_C),
    csvNumber(r.conductorTemperature_C),
    csvNumber(r.drop_V),
    csvNumber(r.drop_percent),
    csvNumber(r.limit_percent),
    r.pass ? "pass" : "fail",
    r.reasons.join("; "),
    r.minimumSize ?? "",
    r.warnings.join(" "),
    String(r.row),
  ]);
  return toCsv([...EXPORT_INPUT_HEADER, ...EXPORT_RESULT_HEADER], data);
}

/** The template: the header with units and two example feeders (invented). */
export function templateCsv(): string {
  const header = EXPORT_INPUT_HEADER.filter((h) => h !== "max conductor temperature (°C)");
  return toCsv(header, [
    ["F-101", "MSB-1", "DB-2 workshop", "copper", "xlpe", "95", "1", "85", "160", "0.85", "ac-3ph-4w", "400", "", "228", "35", ""],
    ["F-102", "MSB-1", "P-07 feed pump", "copper", "pvc", "16", "1", "120", "28", "0.82", "ac-3ph-4w", "400", "E", "", "", "0.8"],
  ]);
}
