/**
 * Checks an uploaded ampacity table file before anything is stored: size limit, text
 * encoding, then every row (lib/engine/ampacity-table). Pure: bytes in, a verdict out.
 */
import { z } from "zod";
import { AMPACITY_TABLE_MAX_ROWS, formatCsvIssue, parseAmpacityCsvDetailed, type AmpacityRow, type CsvIssue } from "@/lib/engine/ampacity-table";

/** Largest file accepted, bytes (2 MB). */
export const AMPACITY_FILE_MAX_BYTES = 2 * 1024 * 1024;
export const AMPACITY_FILE_LIMIT_TEXT = `2 MB and ${AMPACITY_TABLE_MAX_ROWS.toLocaleString("en-GB")} rows`;

/** Name and source as the admin types them (the same schema in the form and the action). */
export const ampacityMetaSchema = z.object({
  name: z
    .string({ error: "Table name is required (1 to 120 characters)" })
    .trim()
    .min(1, { message: "Table name is required (1 to 120 characters)" })
    .max(120, { message: "Table name must be 1 to 120 characters" }),
  source: z
    .string()
    .trim()
    .min(1, { message: "Source is required: say which code, edition and table the values come from (up to 500 characters)" })
    .max(500, { message: "Source must be at most 500 characters" }),
});
export type AmpacityMeta = z.output<typeof ampacityMetaSchema>;

export type FileVerdict =
  | { ok: true; rows: AmpacityRow[]; notes: string[] }
  | { ok: false; message: string; errors: CsvIssue[] };

const REFUSED = "The table was not stored: a code table must be complete, so every row has to be valid. Fix the lines below and upload the whole file again.";

/** Reads the file's bytes as a table, or says everything wrong with it. */
export function checkAmpacityFile(data: Uint8Array, filename: string): FileVerdict {
  if (data.length === 0) return { ok: false, message: `"${filename}" is empty`, errors: [] };
  if (data.length > AMPACITY_FILE_MAX_BYTES)
    return {
      ok: false,
      message: `"${filename}" is ${(data.length / 1024 / 1024).toFixed(1)} MB; an ampacity table file may be at most 2 MB (and ${AMPACITY_TABLE_MAX_ROWS.toLocaleString("en-GB")} rows)`,
      errors: [],
    };
  if (!/\.(csv|txt)$/i.test(filename)) return { ok: false, message: `"${filename}" is not a CSV file: save the table as .csv (comma- or semicolon-separated text)`, errors: [] };
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(data);
  } catch {
    return { ok: false, message: `"${filename}" is not UTF-8 text: save it as "CSV UTF-8" and upload it again`, errors: [] };
  }
  if (text.includes("\u0000")) return { ok: false, message: `"${filename}" is not a text file: save the table as CSV`, errors: [] };
  const parsed = parseAmpacityCsvDetailed(text);
  if (parsed.errors.length > 0) return { ok: false, message: `${REFUSED} ${parsed.errors.length} problem${parsed.errors.length === 1 ? "" : "s"} found.`, errors: parsed.errors };
  return { ok: true, rows: parsed.rows, notes: parsed.notes };
}

export { formatCsvIssue };
