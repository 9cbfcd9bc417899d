/**
 * From the uploaded bytes to rows of cells: the encoding (UTF-8, with or without a byte
 * order mark; anything else is refused with a message saying how to save the file), the
 * separator (comma or semicolon, read from the header line) and the CSV quoting rules
 * (papaparse). Pure.
 */
import Papa from "papaparse";
import { MAX_FILE_BYTES, MAX_FILE_LABEL, MAX_ROWS } from "./types";

export type Separator = "," | ";";

export interface DecodedFile {
  separator: Separator;
  /** True when numbers may use a decimal comma (semicolon files only). */
  decimalComma: boolean;
  hadBom: boolean;
  header: string[];
  /** Data records with their spreadsheet row number (header = 1); empty lines are dropped. */
  records: { row: number; cells: string[] }[];
  notices: string[];
}

export class ScheduleFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ScheduleFileError";
  }
}

const SAVE_AS = 'save it from the spreadsheet as "CSV UTF-8 (comma delimited)" or as CSV with semicolons';

export const formatMegabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(bytes < 1024 * 1024 ? 2 : 1)} MB`;

/** Bytes → text, refusing what is not UTF-8 text. */
export function decodeText(bytes: Uint8Array): { text: string; hadBom: boolean } {
  if (bytes.length === 0) throw new ScheduleFileError("The file is empty: it needs a header row and at least one feeder row.");
  if (bytes.length > MAX_FILE_BYTES)
    throw new ScheduleFileError(`The file is ${formatMegabytes(bytes.length)}; the limit is ${MAX_FILE_LABEL}. Split the schedule into smaller files or remove columns it does not need.`);
  if (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04)
    throw new ScheduleFileError(`This is a spreadsheet workbook (.xlsx or .ods), not a CSV file: ${SAVE_AS}.`);
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))
    throw new ScheduleFileError(`The file is UTF-16 ("Unicode text"), which is not accepted: ${SAVE_AS}.`);
  const hadBom = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf;
  const body = hadBom ? bytes.subarray(3) : bytes;
  if (body.includes(0)) throw new ScheduleFileError(`The file contains binary data (a zero byte), so it is not a CSV text file: ${SAVE_AS}.`);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(body);
  } catch {
    const line = lineOfFirstBadByte(body);
    throw new ScheduleFileError(
      `The file is not valid UTF-8 (first bad character on line ${line}); it was probably saved in a Windows or Mac code page, where characters such as °, ² or é are stored differently: ${SAVE_AS}.`,
    );
  }
  return { text, hadBom };
}

function lineOfFirstBadByte(b: Uint8Array): number {
  const dec = new TextDecoder("utf-8", { fatal: true });
  let line = 1;
  let start = 0;
  for (let i = 0; i <= b.length; i++) {
    if (i === b.length || b[i] === 0x0a) {
      try {
        dec.decode(b.subarray(start, i));
      } catch {
        return line;
      }
      line++;
      start = i + 1;
    }
  }
  return line;
}

/** Counts a character outside double quotes in one line. */
function countOutsideQuotes(line: string, ch: string): number {
  let n = 0;
  let quoted = false;
  for (const c of line) {
    if (c === '"') quoted = !quoted;
    else if (c === ch && !quoted) n++;
  }
  return n;
}

/** The separator, read from the header line: semicolons when it has more of them than commas. */
export function detectSeparator(headerLine: string): Separator {
  const commas = countOutsideQuotes(headerLine, ",");
  const semis = countOutsideQuotes(headerLine, ";");
  if (commas === 0 && semis === 0 && headerLine.includes("\t"))
    throw new ScheduleFileError("The header is separated by tabs; tab-separated files are not accepted: save the schedule as CSV with commas or semicolons.");
  return semis > commas ? ";" : ",";
}

const isEmptyRecord = (cells: string[]) => cells.every((c) => c.trim() === "");

/** The file's text → header and data records. */
export function splitRecords(text: string, hadBom: boolean): DecodedFile {
  const firstLine = text.split(/\r\n|\n|\r/).find((l) => l.trim() !== "") ?? "";
  if (firstLine === "") throw new ScheduleFileError("The file has no header row: it holds only empty lines.");
  const separator = detectSeparator(firstLine);
  const parsed = Papa.parse<string[]>(text, { delimiter: separator, skipEmptyLines: false, header: false });
  const notices: string[] = [];
  notices.push(
    separator === ";"
      ? "Separator: semicolon. Numbers may use a decimal comma (1,5) or a decimal point (1.5)."
      : "Separator: comma. Numbers use a decimal point (1.5); a decimal comma would split a number into two cells, so save with semicolons to use one.",
  );
  notices.push(hadBom ? "Encoding: UTF-8 with a byte order mark." : "Encoding: UTF-8.");
  const quoteError = parsed.errors.find((e) => e.type === "Quotes");
  if (quoteError) {
    const row = (quoteError.row ?? 0) + 1;
    throw new ScheduleFileError(`Row ${row} has a quote (") that is never closed, so the rest of the file would be one cell: close the quote or remove it.`);
  }
  const all = parsed.data.map((cells, i) => ({ row: i + 1, cells: cells.map((c) => (typeof c === "string" ? c : String(c ?? ""))) }));
  const headerIndex = all.findIndex((r) => !isEmptyRecord(r.cells));
  const header = all[headerIndex]!.cells;
  const records = all.slice(headerIndex + 1).filter((r) => !isEmptyRecord(r.cells));
  if (records.length === 0) throw new ScheduleFileError("The file has a header but no feeder rows.");
  if (records.length > MAX_ROWS)
    throw new ScheduleFileError(`The schedule has ${records.length.toLocaleString("en-GB")} rows; the limit is ${MAX_ROWS.toLocaleString("en-GB")} rows per upload. Split it into smaller schedules.`);
  return { separator, decimalComma: separator === ";", hadBom, header, records, notices };
}

/** Bytes → header and records; throws ScheduleFileError with a plain message for a file that cannot be read. */
export function decodeSchedule(bytes: Uint8Array): DecodedFile {
  const { text, hadBom } = decodeText(bytes);
  return splitRecords(text, hadBom);
}
