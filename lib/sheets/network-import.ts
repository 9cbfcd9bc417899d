/**
 * Reading an imported bus network file. Pure: the server action and the tests call it
 * with the file's bytes; it answers with the network in the engine's input shape, or a
 * list of problems in plain words, each naming the row (CSV) or the record (JSON) and
 * the column or field.
 *
 * Two formats:
 * - JSON: an object in the engine's input shape (`networkInputSchema`, SI units). The
 *   node list may be left out: it is then every node the segments and supplies name.
 * - CSV: one table, a header row, then one record per row. The `record` column says
 *   what the row is; the other columns are read for that kind of record only:
 *
 *   record     | columns read
 *   -----------|-------------------------------------------------------------------
 *   setting    | name, value  (name: mode, frequency_Hz, ambient_C, maxTemperature_C, dropLimit_pct)
 *   conductor  | id, material, area_mm2, count, temperature_C, reactance_mohm_per_m, ampacity_A
 *   segment    | id, from, to, conductor, length_m
 *   load       | node, current_A, pf
 *   supply     | node, voltage_V, angle_deg
 *
 *   Units are in the column names (mm², mΩ/m, m, °C, A, V); numbers use a point as the
 *   decimal mark. Header names are case-insensitive and may come in any order; empty
 *   lines are skipped; a byte-order mark is ignored. Nodes are the names the segments
 *   and supplies use.
 */
import Papa from "papaparse";
import { NETWORK_LIMITS, networkInputErrors, type NetworkInput } from "@/lib/engine/network";
import { networkNodes } from "./kinds";
import { localiseMessage } from "./units";

/**
 * Networks with more segments than this are not loaded into the sheet form (a table
 * of thousands of rows in the browser): the sheet shows the server's stored result and
 * takes a replacement file instead.
 */
export const FORM_SEGMENT_LIMIT = 1500;

/** Segments in stored bus network inputs (0 when there is no segment list). */
export function segmentCount(inputs: Record<string, unknown>): number {
  return Array.isArray(inputs.segments) ? inputs.segments.length : 0;
}

/** Largest file accepted, bytes. */
export const MAX_NETWORK_FILE_BYTES = 30 * 1024 * 1024;
/** Problems listed before the list is cut short. */
export const MAX_PROBLEMS = 50;

export interface ImportProblem {
  /** 1-based row of the CSV file (the header is row 1), when the problem is in a row. */
  row?: number;
  /** CSV column or JSON field the problem is in. */
  column?: string;
  message: string;
}

export type NetworkImport =
  | { ok: true; format: "csv" | "json"; network: NetworkInput; counts: { nodes: number; segments: number; loads: number; supplies: number; conductors: number } }
  | { ok: false; format: "csv" | "json" | null; problems: ImportProblem[]; more: number };

/** A problem as one line of text ("Row 12, column length_m: …"). */
export function problemText(p: ImportProblem): string {
  const where = [p.row !== undefined ? `Row ${p.row}` : null, p.column ? `${p.row !== undefined ? "column" : "Field"} ${p.column}` : null].filter(Boolean).join(", ");
  return where ? `${where}: ${p.message}` : p.message;
}

/** Settings a CSV file may leave out: taken from the sheet being replaced. */
export interface NetworkSettings {
  mode?: "ac" | "dc";
  frequency_Hz?: number;
  ambient_C?: number;
  maxTemperature_C?: number;
  dropLimit_pct?: number;
}

const CSV_COLUMNS = [
  "record",
  "name",
  "value",
  "id",
  "material",
  "area_mm2",
  "count",
  "temperature_c",
  "reactance_mohm_per_m",
  "ampacity_a",
  "from",
  "to",
  "conductor",
  "length_m",
  "node",
  "current_a",
  "pf",
  "voltage_v",
  "angle_deg",
] as const;
type CsvColumn = (typeof CSV_COLUMNS)[number];

const SETTING_NAMES = ["mode", "frequency_Hz", "ambient_C", "maxTemperature_C", "dropLimit_pct"] as const;
const RECORDS = ["setting", "conductor", "segment", "load", "supply"] as const;

/** The CSV column each engine field is read from, per record list. */
const FIELD_COLUMN: Record<string, Record<string, string>> = {
  conductors: {
    id: "id",
    materialId: "material",
    area_m2: "area_mm2",
    count: "count",
    conductorTemperature_C: "temperature_C",
    reactance_ohm_per_m: "reactance_mohm_per_m",
    ampacity_A: "ampacity_A",
    temperId: "material",
  },
  segments: { id: "id", from: "from", to: "to", conductor: "conductor", length_m: "length_m" },
  loads: { node: "node", current_A: "current_A", pf: "pf" },
  supplies: { node: "node", voltage_V: "voltage_V", angle_deg: "angle_deg" },
};

const NUMERIC = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** A CSV cell as the engine takes it: a number when it reads as one (scaled to SI), else the text (the schema names it). */
function numberCell(text: string, scale = 1): number | string | undefined {
  const t = text.trim();
  if (t === "") return undefined;
  const compact = t.replace(/\s+/g, "");
  if (!NUMERIC.test(compact)) return t;
  const n = Number(compact) * scale;
  return scale === 1 ? n : Number(n.toPrecision(9));
}

const textCell = (text: string): string | undefined => (text.trim() === "" ? undefined : text.trim());

function byteLength(content: string | Uint8Array): number {
  return typeof content === "string" ? new TextEncoder().encode(content).length : content.byteLength;
}

const mb = (bytes: number) => (bytes / (1024 * 1024)).toFixed(1);

function failure(format: "csv" | "json" | null, problems: ImportProblem[]): NetworkImport {
  return { ok: false, format, problems: problems.slice(0, MAX_PROBLEMS), more: Math.max(0, problems.length - MAX_PROBLEMS) };
}

/**
 * Reads a network file (.json or .csv; a file starting with "{" is JSON whatever its
 * name). `settings` fills what a CSV file does not set.
 */
export function parseNetworkFile(fileName: string, content: string | Uint8Array, settings: NetworkSettings = {}): NetworkImport {
  const size = byteLength(content);
  if (size > MAX_NETWORK_FILE_BYTES)
    return failure(null, [{ message: `The file is ${mb(size)} MB; network files can be at most ${MAX_NETWORK_FILE_BYTES / (1024 * 1024)} MB. Split the network or remove unused records.` }]);
  if (size === 0) return failure(null, [{ message: "The file is empty." }]);
  let text: string;
  try {
    text = typeof content === "string" ? content : new TextDecoder("utf-8", { fatal: true }).decode(content);
  } catch {
    return failure(null, [{ message: "The file is not UTF-8 text; save it as CSV (UTF-8) or JSON." }]);
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const lower = fileName.toLowerCase();
  const looksJson = text.trimStart().startsWith("{");
  if (lower.endsWith(".json") || looksJson) return parseJson(text);
  if (lower.endsWith(".csv") || lower.endsWith(".txt") || !lower.includes(".")) return parseCsv(text, settings);
  return failure(null, [{ message: `"${fileName}" is neither a .csv nor a .json file.` }]);
}

// ---------------------------------------------------------------------------------
// JSON

const LIST_NOUN: Record<string, string> = { conductors: "Conductor", segments: "Segment", loads: "Load", supplies: "Supply", nodes: "Node" };

/** "segments.12.length_m" → { column: "segments[13].length_m", message with the record's id }. */
function jsonProblem(network: Record<string, unknown>, path: string, message: string): ImportProblem {
  const m = /^(\w+)\.(\d+)(?:\.(.+))?$/.exec(path);
  if (!m) return { column: path === "_" ? undefined : path, message };
  const [, list, idx, field] = m;
  const rows = network[list!];
  const rec = Array.isArray(rows) ? (rows[Number(idx)] as Record<string, unknown> | undefined) : undefined;
  const name = rec && typeof rec.id === "string" ? ` "${rec.id}"` : rec && typeof rec.node === "string" ? ` at "${rec.node}"` : "";
  return { column: `${list}[${Number(idx) + 1}]${field ? `.${field}` : ""}`, message: `${LIST_NOUN[list!] ?? list} ${Number(idx) + 1}${name}: ${message}` };
}

function parseJson(text: string): NetworkImport {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    return failure("json", [{ message: `The file is not valid JSON (${e instanceof Error ? e.message : "unreadable"}).` }]);
  }
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) return failure("json", [{ message: "The JSON file must hold one object with conductors, segments, supplies and loads." }]);
  const obj = raw as Record<string, unknown>;
  const network = (obj.nodes === undefined ? { ...obj, nodes: networkNodes(obj) } : obj) as Record<string, unknown>;
  const errors = networkInputErrors(network);
  if (errors) return failure("json", Object.entries(errors).map(([path, message]) => jsonProblem(network, path, message)));
  return success("json", network as unknown as NetworkInput);
}

function success(format: "csv" | "json", network: NetworkInput): NetworkImport {
  if (network.supplies.length === 0)
    return failure(format, [{ message: format === "csv" ? "The file has no supply row: add a row with record supply, the incomer's node and its voltage_V." : "supplies: give at least one supply node with its voltage." }]);
  return {
    ok: true,
    format,
    network,
    counts: { nodes: network.nodes.length, segments: network.segments.length, loads: network.loads?.length ?? 0, supplies: network.supplies.length, conductors: network.conductors.length },
  };
}

// ---------------------------------------------------------------------------------
// CSV

function parseCsv(text: string, settings: NetworkSettings): NetworkImport {
  const parsed = Papa.parse<string[]>(text, { header: false, skipEmptyLines: false, delimiter: "" });
  const rows = parsed.data;
  const problems: ImportProblem[] = [];
  // A row of the file is its index + 1 (no multi-line cells in this format).
  const headerAt = rows.findIndex((r) => r.some((c) => c.trim() !== ""));
  if (headerAt < 0) return failure("csv", [{ message: "The file has no rows." }]);
  const header = rows[headerAt]!.map((h) => h.trim().toLowerCase());
  const col = new Map<CsvColumn, number>();
  header.forEach((h, i) => {
    if ((CSV_COLUMNS as readonly string[]).includes(h)) col.set(h as CsvColumn, i);
    else if (h !== "") problems.push({ row: headerAt + 1, column: h, message: `unknown column "${h}"; the columns are: ${CSV_COLUMNS.join(", ")}` });
  });
  if (!col.has("record")) return failure("csv", [{ row: headerAt + 1, message: `the header row needs a "record" column (setting, conductor, segment, load or supply); found: ${header.filter(Boolean).join(", ") || "nothing"}` }]);
  if (problems.length) return failure("csv", problems);

  const head: Record<string, unknown> = { ...settings };
  const conductors: Record<string, unknown>[] = [];
  const segments: Record<string, unknown>[] = [];
  const loads: Record<string, unknown>[] = [];
  const supplies: Record<string, unknown>[] = [];
  const rowOf: Record<string, number[]> = { conductors: [], segments: [], loads: [], supplies: [] };
  const settingRow: Record<string, number> = {};

  for (let r = headerAt + 1; r < rows.length; r++) {
    const cells = rows[r]!;
    if (cells.every((c) => c.trim() === "")) continue;
    const line = r + 1;
    const cell = (c: CsvColumn) => {
      const i = col.get(c);
      return i === undefined ? "" : (cells[i] ?? "");
    };
    const record = cell("record").trim().toLowerCase();
    switch (record) {
      case "setting": {
        const name = cell("name").trim();
        const setting = SETTING_NAMES.find((s) => s.toLowerCase() === name.toLowerCase());
        if (!setting) {
          problems.push({ row: line, column: "name", message: `unknown setting "${name}"; settings are: ${SETTING_NAMES.join(", ")}` });
          break;
        }
        head[setting] = setting === "mode" ? cell("value").trim().toLowerCase() : numberCell(cell("value"));
        settingRow[setting] = line;
        break;
      }
      case "conductor":
        rowOf.conductors!.push(line);
        conductors.push(
          compact({
            id: textCell(cell("id")),
            materialId: textCell(cell("material")),
            area_m2: numberCell(cell("area_mm2"), 1e-6),
            count: numberCell(cell("count")),
            conductorTemperature_C: numberCell(cell("temperature_c")),
            reactance_ohm_per_m: numberCell(cell("reactance_mohm_per_m"), 1e-3),
            ampacity_A: numberCell(cell("ampacity_a")),
          }),
        );
        break;
      case "segment":
        rowOf.segments!.push(line);
        segments.push(compact({ id: textCell(cell("id")), from: textCell(cell("from")), to: textCell(cell("to")), conductor: textCell(cell("conductor")), length_m: numberCell(cell("length_m")) }));
        break;
      case "load":
        rowOf.loads!.push(line);
        loads.push(compact({ node: textCell(cell("node")), current_A: numberCell(cell("current_a")), pf: numberCell(cell("pf")) }));
        break;
      case "supply":
        rowOf.supplies!.push(line);
        supplies.push(compact({ node: textCell(cell("node")), voltage_V: numberCell(cell("voltage_v")), angle_deg: numberCell(cell("angle_deg")) }));
        break;
      default:
        problems.push({ row: line, column: "record", message: record === "" ? `the record type is missing; use one of: ${RECORDS.join(", ")}` : `unknown record type "${record}"; use one of: ${RECORDS.join(", ")}` });
    }
    if (problems.length > MAX_PROBLEMS) break;
    if (segments.length > NETWORK_LIMITS.maxSegments || loads.length > NETWORK_LIMITS.maxLoads) {
      problems.push({ row: line, message: `the file has more than ${NETWORK_LIMITS.maxSegments.toLocaleString("en")} segments or ${NETWORK_LIMITS.maxLoads.toLocaleString("en")} loads; split the network` });
      break;
    }
  }
  if (problems.length) return failure("csv", problems);
  if (head.mode === undefined) head.mode = "ac";

  const network: Record<string, unknown> = { ...head, conductors, segments, supplies, loads };
  network.nodes = networkNodes(network);
  const errors = networkInputErrors(network);
  if (errors) return failure("csv", Object.entries(errors).map(([path, message]) => csvProblem(path, message, rowOf, settingRow)));
  return success("csv", network as unknown as NetworkInput);
}

/** Drops absent cells so that optional fields take the schema's defaults. */
function compact(o: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) out[k] = v;
  return out;
}

/** An engine field message → the CSV row and column it came from, in the file's units. */
function csvProblem(path: string, message: string, rowOf: Record<string, number[]>, settingRow: Record<string, number>): ImportProblem {
  const m = /^(\w+)\.(\d+)(?:\.(\w+))?/.exec(path);
  // the file's units are the metric form units (mm², mΩ/m): say the range in them
  const text = localiseMessage("bus-network", path, message, "metric");
  if (m) {
    const [, list, idx, field] = m;
    const row = rowOf[list!]?.[Number(idx)];
    const column = field ? (FIELD_COLUMN[list!]?.[field] ?? field) : undefined;
    if (list === "nodes") return { message: `node ${Number(idx) + 1}: ${text}` };
    return { ...(row !== undefined ? { row } : {}), ...(column ? { column } : {}), message: text };
  }
  const top = path.split(".")[0]!;
  if (top in settingRow) return { row: settingRow[top], column: "value", message: `${top}: ${text}` };
  if (top === "conductors" || top === "segments" || top === "supplies" || top === "loads" || top === "nodes") return { message: text };
  return { message: path === "_" ? text : `${top}: ${text}` };
}
