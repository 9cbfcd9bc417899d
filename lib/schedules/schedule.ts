/**
 * A whole schedule file, from bytes to results: decode, read the header, validate every
 * row, compute the valid ones. A file that cannot be read at all (encoding, header,
 * limits) throws ScheduleFileError; a bad row is listed with its errors and the other
 * rows are still computed. Pure.
 */
import type { AmpacityTable } from "@/lib/engine/ampacity-table";
import { parseHeader } from "./columns";
import { computeRow, headerLookup } from "./compute";
import { decodeSchedule, ScheduleFileError } from "./decode";
import { rowSchema, validateRow } from "./rows";
import type { ScheduleComputation, ScheduleError, ScheduleOptions, ScheduleRowResult } from "./types";

export { ScheduleFileError };

/** Errors kept per upload; beyond this the list ends with a count of the rest. */
export const MAX_LISTED_ERRORS = 2000;

export interface ProcessInput {
  bytes: Uint8Array;
  options: ScheduleOptions;
  table: AmpacityTable | null;
  tableLabel: string | null;
}

export function processSchedule({ bytes, options, table, tableLabel }: ProcessInput): ScheduleComputation {
  const file = decodeSchedule(bytes);
  const header = parseHeader(file.header);
  if (header.errors.length) throw new ScheduleFileError(header.errors.join(" "));
  const notices = [...file.notices];
  if (header.ignored.length) notices.push(`Columns not used (ignored): ${header.ignored.map((h) => `"${h}"`).join(", ")}.`);
  const schema = rowSchema(header.columns);
  const ctx = { columns: header.columns, decimalComma: file.decimalComma };
  const lookup = headerLookup(header.columns);
  const results: ScheduleRowResult[] = [];
  const errors: ScheduleError[] = [];
  let errorRows = 0;
  const tags = new Map<string, number>();
  for (const rec of file.records) {
    const v = validateRow(schema, rec.row, rec.cells, ctx, file.header.length);
    const outcome = v.ok ? computeRow(v.value, { options, table, tableLabel, header: lookup }) : v;
    if (!outcome.ok) {
      errorRows++;
      errors.push(...outcome.errors);
      continue;
    }
    const r = outcome.result;
    const first = tags.get(r.tag.toLowerCase());
    if (first !== undefined) r.warnings.push(`Tag "${r.tag}" is also used on row ${first}.`);
    else tags.set(r.tag.toLowerCase(), r.row);
    results.push(r);
  }
  let listed = errors;
  if (errors.length > MAX_LISTED_ERRORS) {
    listed = errors.slice(0, MAX_LISTED_ERRORS);
    listed.push({ row: 0, column: "", message: `${errors.length - MAX_LISTED_ERRORS} more errors are not listed; correct the ones above and upload again.` });
  }
  if (errorRows) notices.push(`${errorRows} row${errorRows === 1 ? "" : "s"} with errors ${errorRows === 1 ? "was" : "were"} left out; the other rows were computed.`);
  return {
    rowCount: file.records.length,
    validCount: results.length,
    failCount: results.filter((r) => !r.pass).length,
    results,
    errors: listed,
    notices,
  };
}
