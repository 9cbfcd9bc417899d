/**
 * An organisation's own ampacity table (size, material, insulation, installation method,
 * reference ambient, amps) and its lookup with the ambient-temperature and grouping
 * corrections applied.
 */
import { z } from "zod";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";
import { awgToArea_m2, kcmilToArea_m2, tempToC } from "./units";

export const TABLE_METALS = ["copper", "aluminium"] as const;
export const TABLE_INSULATIONS = ["pvc", "xlpe", "epr", "rubber-60", "thhn", "thwn", "xhhw", "other"] as const;

/**
 * Text that may arrive as a number: a form round trip turns a label such as "95" or a
 * method code such as "1" into a number; it is the same text.
 */
export const tableText = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? String(v) : v);

/** The organisation's installation method code: free text, 1 to 40 characters. */
export const installationCode = z.preprocess(
  tableText,
  z
    .string({ error: "Installation method is required (1 to 40 characters)" })
    .trim()
    .min(1, { message: "Installation method is required (1 to 40 characters)" })
    .max(40, { message: "Installation method must be 1 to 40 characters" }),
);

export const ampacityRowSchema = z.object({
  size_m2: num("Conductor size", "m²", 0, 0.01, { exclusiveMin: true }),
  /** Optional label as the organisation writes it ("95 mm²", "4/0"). */
  label: z.preprocess(tableText, z.string().max(40, { message: "Label must be at most 40 characters" }).optional()),
  material: choice("Conductor material", TABLE_METALS),
  insulation: choice("Insulation", TABLE_INSULATIONS),
  /** Free text of the organisation's method code, e.g. "E", "F-trefoil", "tray". */
  installation: installationCode,
  referenceAmbient_C: num("Reference ambient temperature", "°C", -20, 60),
  /** Maximum conductor temperature the row was computed for. */
  conductorMax_C: num("Maximum conductor temperature", "°C", 40, 250),
  ampacity_A: num("Ampacity", "A", 0, 100_000, { exclusiveMin: true }),
});

export const ampacityTableSchema = z.object({
  name: z.string().trim().min(1, { message: "Table name is required (1 to 120 characters)" }).max(120, { message: "Table name must be 1 to 120 characters" }),
  source: z.string().max(500).optional(),
  rows: z.array(ampacityRowSchema).min(1, { message: "The table needs at least one row" }).max(5000, { message: "The table may have at most 5000 rows" }),
});

export type AmpacityRow = z.output<typeof ampacityRowSchema>;
export type AmpacityTable = z.output<typeof ampacityTableSchema>;

/**
 * Ambient correction k = √((θ_max − θ_a)/(θ_max − θ_ref)): the rating scales with the square
 * root of the allowed temperature rise (losses ∝ I²) — the formula behind IEC 60364-5-52:2009
 * Table B.52.14 and NEC 2020 310.15(B)(1) equation (310.15(B)(2)(a) in 2014/2017).
 * Returns 0 when the ambient is at or above θ_max.
 */
export function ambientCorrectionFactor(thetaMax_C: number, ambient_C: number, reference_C: number): number {
  if (ambient_C >= thetaMax_C) return 0;
  return Math.sqrt((thetaMax_C - ambient_C) / (thetaMax_C - reference_C));
}

// ---------------------------------------------------------------------------------------
// Grouping: IEC 60364-5-52:2009 Table B.52.17 (from memory), items 1–5.
// ---------------------------------------------------------------------------------------

export const GROUPING_ARRANGEMENTS = ["bunched", "single-layer-wall", "single-layer-ceiling", "single-layer-perforated-tray", "single-layer-ladder"] as const;
export type GroupingArrangement = (typeof GROUPING_ARRANGEMENTS)[number];

const GROUP_COUNTS = [1, 2, 3, 4, 5, 6, 7, 8, 9, 12, 16, 20] as const;

/**
 * Reduction factors for groups of more than one circuit or multi-core cable — IEC 60364-5-52:2009
 * Table B.52.17 (from memory). Items 2–5 stop at nine: "no further reduction for more than nine
 * circuits or multi-core cables".
 */
export const GROUPING_FACTORS: Record<GroupingArrangement, { label: string; factors: readonly number[] }> = {
  bunched: { label: "Bunched in air, on a surface, embedded or enclosed (item 1)", factors: [1.0, 0.8, 0.7, 0.65, 0.6, 0.57, 0.54, 0.52, 0.5, 0.45, 0.41, 0.38] },
  "single-layer-wall": { label: "Single layer on wall, floor or unperforated tray (item 2)", factors: [1.0, 0.85, 0.79, 0.75, 0.73, 0.72, 0.72, 0.71, 0.7] },
  "single-layer-ceiling": { label: "Single layer fixed directly under a wooden ceiling (item 3)", factors: [0.95, 0.81, 0.72, 0.68, 0.66, 0.64, 0.63, 0.62, 0.61] },
  "single-layer-perforated-tray": { label: "Single layer on a perforated horizontal or vertical tray (item 4)", factors: [1.0, 0.88, 0.82, 0.77, 0.75, 0.73, 0.73, 0.72, 0.72] },
  "single-layer-ladder": { label: "Single layer on ladder support or cleats (item 5)", factors: [1.0, 0.87, 0.82, 0.8, 0.8, 0.79, 0.79, 0.78, 0.78] },
};

/**
 * Grouping factor for `circuits` circuits or multi-core cables. Counts between tabulated
 * columns take the next larger column (the lower factor); items 2–5 beyond nine take the
 * nine value; item 1 beyond twenty is outside the table (undefined).
 */
export function groupingFactor(arrangement: GroupingArrangement, circuits: number): number | undefined {
  const f = GROUPING_FACTORS[arrangement].factors;
  const i = GROUP_COUNTS.findIndex((c) => c >= circuits);
  if (i < 0) return undefined;
  if (i >= f.length) return f[f.length - 1];
  return f[i];
}

// ---------------------------------------------------------------------------------------
// Lookup
// ---------------------------------------------------------------------------------------

export const ampacityLookupInputSchema = z.object({
  table: ampacityTableSchema,
  size_m2: num("Conductor size", "m²", 0, 0.01, { exclusiveMin: true }),
  material: choice("Conductor material", TABLE_METALS),
  insulation: choice("Insulation", TABLE_INSULATIONS),
  installation: z.string().trim().min(1, { message: "Installation method is required (1 to 40 characters)" }).max(40),
  ambient_C: num("Ambient temperature", "°C", -40, 80),
  /** A grouping factor given directly (organisation practice or another table). */
  groupingFactor: num("Grouping factor", "", 0, 1, { exclusiveMin: true }).optional(),
  /** Or an arrangement and count from IEC 60364-5-52 Table B.52.17. */
  grouping: z.object({ arrangement: choice("Grouping arrangement", GROUPING_ARRANGEMENTS), circuits: int("Number of circuits", 1, 100) }).optional(),
  /** Any further factor (soil, harmonics, solar): multiplied in and reported. */
  otherFactor: num("Other correction factor", "", 0, 2, { exclusiveMin: true }).default(1),
});

export type AmpacityLookupInput = z.input<typeof ampacityLookupInputSchema>;

export interface AmpacityLookupResults {
  row: AmpacityRow;
  tabulated_A: number;
  ambientFactor: number;
  groupingFactor: number;
  groupingSource: string;
  otherFactor: number;
  corrected_A: number;
}

const SIZE_MATCH = 1e-3;

export function findAmpacityRow(table: AmpacityTable, size_m2: number, material: string, insulation: string, installation: string): AmpacityRow | undefined {
  const inst = installation.trim().toLowerCase();
  return table.rows.find(
    (r) => Math.abs(r.size_m2 - size_m2) <= SIZE_MATCH * size_m2 && r.material === material && r.insulation === insulation && r.installation.trim().toLowerCase() === inst,
  );
}

/** Tabulated sizes (m², ascending) for one material, insulation and installation. */
export function tableSizes(table: AmpacityTable, material: string, insulation: string, installation: string): number[] {
  const inst = installation.trim().toLowerCase();
  return [...new Set(table.rows.filter((r) => r.material === material && r.insulation === insulation && r.installation.trim().toLowerCase() === inst).map((r) => r.size_m2))].sort((a, b) => a - b);
}

const FORMULAS: Formula[] = [
  { id: "k-ambient", expression: "k_a = √((θ_max − θ_a)/(θ_max − θ_ref))", source: "IEC 60364-5-52:2009 Table B.52.14 basis; NEC 2020 310.15(B)(1) equation" },
  { id: "iz", expression: "I_z = I_tab·k_a·k_g·k_other", source: "IEC 60364-5-52:2009 §523 (correction factors applied to tabulated values)" },
];

export function ampacityFromTable(input: AmpacityLookupInput): CalcResult<AmpacityLookupResults> {
  const v = ampacityLookupInputSchema.parse(input);
  const row = findAmpacityRow(v.table, v.size_m2, v.material, v.insulation, v.installation);
  if (!row) {
    throw new EngineError(
      "no-table-row",
      `Table "${v.table.name}" has no row for ${(v.size_m2 * 1e6).toPrecision(4)} mm² ${v.material} ${v.insulation} in installation "${v.installation}"`,
      "size_m2",
    );
  }
  const warnings: Warning[] = [];
  const ka = ambientCorrectionFactor(row.conductorMax_C, v.ambient_C, row.referenceAmbient_C);
  if (ka === 0) warnings.push({ code: "ambient-above-limit", message: `Ambient ${v.ambient_C} °C is at or above the conductor limit ${row.conductorMax_C} °C: no current can be carried.` });
  let kg = 1;
  let groupingSource = "no grouping";
  if (v.groupingFactor !== undefined) {
    kg = v.groupingFactor;
    groupingSource = "given";
    if (v.grouping) warnings.push({ code: "grouping-both", message: "Both a grouping factor and an arrangement were given; the given factor was used." });
  } else if (v.grouping) {
    const g = groupingFactor(v.grouping.arrangement, v.grouping.circuits);
    if (g === undefined) {
      const last = GROUPING_FACTORS[v.grouping.arrangement].factors.at(-1)!;
      warnings.push({ code: "grouping-outside-table", message: `${v.grouping.circuits} circuits is beyond IEC 60364-5-52 Table B.52.17 (20 at most); the 20-circuit factor ${last} was used and is not conservative.` });
      kg = last;
    } else kg = g;
    groupingSource = `IEC 60364-5-52:2009 Table B.52.17, ${GROUPING_FACTORS[v.grouping.arrangement].label}, ${v.grouping.circuits} circuit(s) — from memory`;
  }
  const corrected = row.ampacity_A * ka * kg * v.otherFactor;
  return {
    kind: "ampacity-table",
    engineVersion: ENGINE_VERSION,
    results: { row, tabulated_A: row.ampacity_A, ambientFactor: ka, groupingFactor: kg, groupingSource, otherFactor: v.otherFactor, corrected_A: corrected },
    intermediates: {
      Itab: q("Tabulated ampacity", row.ampacity_A, "A"),
      ka: q("Ambient correction factor", ka, ""),
      kg: q("Grouping factor", kg, ""),
      ko: q("Other factor", v.otherFactor, ""),
      Iz: q("Corrected ampacity", corrected, "A"),
    },
    formulas: FORMULAS,
    warnings,
    checks: [check("ambient", "Ambient below conductor limit", v.ambient_C, row.conductorMax_C, "°C")],
  };
}

// ---------------------------------------------------------------------------------------
// CSV import (pure: text in, rows and plain-worded problems out)
// ---------------------------------------------------------------------------------------

/** A code table must be complete: at most this many rows, and every row must be valid. */
export const AMPACITY_TABLE_MAX_ROWS = 5000;

/**
 * Conductor limit by insulation when the file has no maximum-temperature column:
 * IEC 60364-5-52:2009 Table 52.1 (PVC 70 °C, XLPE/EPR 90 °C, rubber 60 °C) and NEC 2020
 * Table 310.4(A) (THHN 90 °C, THWN 75 °C, XHHW 90 °C dry) — from memory. "other" needs the column.
 */
export const INSULATION_DEFAULT_MAX_C: Record<(typeof TABLE_INSULATIONS)[number], number | undefined> = {
  pvc: 70,
  xlpe: 90,
  epr: 90,
  "rubber-60": 60,
  thhn: 90,
  thwn: 75,
  xhhw: 90,
  other: undefined,
};

/** One problem of an uploaded table: the file line (1 = first line) and the column as headed in the file. */
export interface CsvIssue {
  line: number;
  column?: string;
  message: string;
}

export interface ParsedAmpacityCsv {
  rows: AmpacityRow[];
  /** Every problem found; the table is refused when there is any. */
  errors: CsvIssue[];
  /** How the file was read (separator, units), for the upload summary. */
  notes: string[];
}

type ColumnKey = "size" | "label" | "material" | "insulation" | "installation" | "referenceAmbient" | "conductorMax" | "ampacity";
type SizeUnit = "mm2" | "kcmil" | "awg" | "awg-kcmil";
type TempUnitCF = "C" | "F";

const COLUMN_NAMES: Record<ColumnKey, string> = {
  size: "size",
  label: "label",
  material: "material",
  insulation: "insulation",
  installation: "installation method",
  referenceAmbient: "reference ambient",
  conductorMax: "conductor maximum temperature",
  ampacity: "amps",
};

const REQUIRED: ColumnKey[] = ["size", "material", "insulation", "installation", "referenceAmbient", "ampacity"];

/** Splits CSV text into records with the line each starts on. Quotes ("…", "" inside) may hold separators and line breaks. */
export function splitCsv(text: string, separator: string): { line: number; cells: string[] }[] {
  const out: { line: number; cells: string[] }[] = [];
  let cells: string[] = [];
  let cell = "";
  let quoted = false;
  let line = 1;
  let start = 1;
  let atRecordStart = true;
  let comment = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (comment) {
      if (ch === "\n") {
        comment = false;
        line++;
        start = line;
        atRecordStart = true;
      }
      continue;
    }
    if (quoted) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          cell += '"';
          i++;
        } else quoted = false;
      } else {
        if (ch === "\n") line++;
        cell += ch;
      }
      continue;
    }
    if (atRecordStart && ch === "#") {
      comment = true;
      continue;
    }
    atRecordStart = false;
    if (ch === '"' && cell.trim() === "") {
      cell = "";
      quoted = true;
    } else if (ch === separator) {
      cells.push(cell);
      cell = "";
    } else if (ch === "\n" || ch === "\r") {
      if (ch === "\r" && text[i + 1] === "\n") i++;
      cells.push(cell);
      out.push({ line: start, cells });
      cells = [];
      cell = "";
      line++;
      start = line;
      atRecordStart = true;
    } else cell += ch;
  }
  if (!atRecordStart || cell !== "" || cells.length > 0) {
    cells.push(cell);
    out.push({ line: start, cells });
  }
  return out.filter((r) => r.cells.some((c) => c.trim() !== ""));
}

/** The separator of the header line: semicolon (decimal-comma locales), tab, or comma. */
function detectSeparator(text: string): ";" | "," | "\t" {
  const first = text.split(/\r?\n/).find((l) => l.trim() !== "" && !l.trim().startsWith("#")) ?? "";
  const count = (c: string) => first.split(c).length - 1;
  if (count(";") > 0 && count(";") >= count(",")) return ";";
  if (count("\t") > 0 && count("\t") >= count(",")) return "\t";
  return ",";
}

/** A header cell → the column it is, and the unit it states. */
function readHeader(raw: string): { key?: ColumnKey; size?: SizeUnit; temp?: TempUnitCF } {
  const h = raw.trim().toLowerCase().replace(/²/g, "2").replace(/º/g, "°");
  const words = h.replace(/[()[\]{}/_,.:;-]+/g, " ").replace(/\s+/g, " ").trim();
  const has = (re: RegExp) => re.test(words);
  const temp = (): TempUnitCF | undefined => (/°f|\bdeg ?f\b|fahrenheit|\bf$/.test(h) || has(/\bf\b/) ? "F" : /°c|\bdeg ?c\b|celsius/.test(h) || has(/\bc\b/) ? "C" : undefined);
  if (has(/ambient/)) return { key: "referenceAmbient", temp: temp() };
  if (has(/\b(max|maximum|temp|temperature)\b/) || has(/conductor ?max/)) return { key: "conductorMax", temp: temp() };
  if (has(/\b(size|section|cross section|area|gauge)\b/) || /^size/.test(words)) {
    const awg = has(/\bawg\b/);
    const kcmil = has(/\b(kcmil|mcm)\b/);
    const size: SizeUnit | undefined = awg && kcmil ? "awg-kcmil" : awg ? "awg" : kcmil ? "kcmil" : has(/\b(mm2|mm|sq ?mm)\b/) ? "mm2" : undefined;
    return { key: "size", size };
  }
  if (has(/\b(label|designation)\b/)) return { key: "label" };
  if (has(/\b(material|metal)\b/)) return { key: "material" };
  if (has(/\binsulation\b/)) return { key: "insulation" };
  if (has(/\b(installation|method)\b/)) return { key: "installation" };
  if (has(/\b(amps?|ampacity|current|rating|iz)\b/)) return { key: "ampacity" };
  return {};
}

/** A number as written in a table: spaces as digit groups allowed, a lone comma taken as the decimal mark. */
export function parseTableNumber(text: string): number {
  let t = text.trim().replace(/[\s\u00a0\u202f']/g, "");
  if (/^[-+]?\d*,\d+$/.test(t)) t = t.replace(",", ".");
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return Number.NaN;
  return Number(t);
}

/** Size text → m², in the column's unit. In an "AWG/kcmil" column a bare number up to 40 or n/0 is AWG, a larger one kcmil. */
function sizeToM2(text: string, unit: SizeUnit): number | string {
  const t = text.trim().toLowerCase().replace(/\s*(awg|kcmil|mcm|mm2|mm²)$/, "");
  const explicit = /(awg|kcmil|mcm)$/.exec(text.trim().toLowerCase())?.[1];
  const awgText = /^([1-4]\/0|0{1,4}|\d{1,2})$/.test(t);
  const asAwg = (): number | string => {
    if (!awgText) return `"${text.trim()}" is not an AWG size (write 14, 12 … 1, 1/0 … 4/0)`;
    try {
      return awgToArea_m2(t);
    } catch {
      return `"${text.trim()}" is not an AWG size (write 40 … 1, 1/0 … 4/0)`;
    }
  };
  const n = parseTableNumber(t);
  if (unit === "awg" || explicit === "awg") return asAwg();
  if (unit === "kcmil" || explicit === "kcmil" || explicit === "mcm") return Number.isFinite(n) && n > 0 ? kcmilToArea_m2(n) : `"${text.trim()}" is not a size in kcmil (a number greater than 0)`;
  if (unit === "awg-kcmil") {
    if (/\//.test(t) || (Number.isInteger(n) && n <= 40)) return asAwg();
    return Number.isFinite(n) && n > 0 ? kcmilToArea_m2(n) : `"${text.trim()}" is not an AWG size or a size in kcmil`;
  }
  return Number.isFinite(n) && n > 0 ? n / 1e6 : `"${text.trim()}" is not a size in mm² (a number greater than 0)`;
}

const MATERIAL_ALIASES: Record<string, (typeof TABLE_METALS)[number]> = { copper: "copper", cu: "copper", aluminium: "aluminium", aluminum: "aluminium", al: "aluminium" };

const SIZE_PRECISION = 6;

/**
 * Reads an organisation's ampacity table from CSV text (a byte-order mark is removed).
 * Columns are found by their header, in any order: size (its unit in the header: mm², kcmil,
 * AWG or AWG/kcmil), material, insulation, installation method, reference ambient (°C or °F
 * in the header), amps; optional label and conductor maximum temperature (°C or °F; by
 * default the insulation's limit). Separator: comma, semicolon or tab; a decimal comma is
 * read when the separator is not a comma or the value is quoted. Lines starting with # are
 * comments. Every problem is collected with its line and column; sizes are converted to m²
 * and temperatures to °C here, at the edge.
 */
export function parseAmpacityCsvDetailed(csvText: string): ParsedAmpacityCsv {
  const text = csvText.replace(/^\uFEFF/, "");
  const errors: CsvIssue[] = [];
  const notes: string[] = [];
  const sep = detectSeparator(text);
  const records = splitCsv(text, sep);
  const header = records.shift();
  if (!header) return { rows: [], errors: [{ line: 1, message: "The file is empty: it needs a header line and at least one row" }], notes };
  notes.push(`Separator: ${sep === ";" ? "semicolon" : sep === "\t" ? "tab" : "comma"}`);

  const cols = new Map<ColumnKey, { index: number; title: string; size?: SizeUnit; temp?: TempUnitCF }>();
  header.cells.forEach((raw, index) => {
    const title = raw.trim();
    if (title === "") return;
    const h = readHeader(title);
    if (!h.key) {
      errors.push({ line: header.line, column: title, message: `Column "${title}" is not one Ohmstead reads (size, label, material, insulation, installation method, reference ambient, conductor maximum temperature, amps)` });
      return;
    }
    if (cols.has(h.key)) {
      errors.push({ line: header.line, column: title, message: `Column "${title}" repeats the ${COLUMN_NAMES[h.key]} column "${cols.get(h.key)!.title}"` });
      return;
    }
    cols.set(h.key, { index, title, ...(h.size ? { size: h.size } : {}), ...(h.temp ? { temp: h.temp } : {}) });
  });
  for (const k of REQUIRED) if (!cols.has(k)) errors.push({ line: header.line, message: `The ${COLUMN_NAMES[k]} column is missing; the header needs: size (mm², kcmil or AWG), material, insulation, installation method, reference ambient (°C or °F), amps` });
  const size = cols.get("size");
  if (size && !size.size) errors.push({ line: header.line, column: size.title, message: `Column "${size.title}" does not say its unit: write "size (mm2)", "size (kcmil)", "size (AWG)" or "size (AWG/kcmil)"` });
  for (const k of ["referenceAmbient", "conductorMax"] as const) {
    const c = cols.get(k);
    if (c && !c.temp) errors.push({ line: header.line, column: c.title, message: `Column "${c.title}" does not say its unit: add (°C) or (°F) to the header` });
  }
  if (errors.length > 0) return { rows: [], errors, notes };
  if (size?.size) notes.push(`Sizes in ${size.size === "mm2" ? "mm²" : size.size === "awg-kcmil" ? "AWG and kcmil" : size.size === "awg" ? "AWG" : "kcmil"}`);
  const amb = cols.get("referenceAmbient")!;
  notes.push(`Temperatures in °${amb.temp}`);

  if (records.length === 0) errors.push({ line: header.line + 1, message: "The table has a header but no rows" });
  if (records.length > AMPACITY_TABLE_MAX_ROWS) {
    errors.push({ line: records[AMPACITY_TABLE_MAX_ROWS]!.line, message: `The file has ${records.length} rows; a table may have at most ${AMPACITY_TABLE_MAX_ROWS}` });
    return { rows: [], errors, notes };
  }

  const rows: AmpacityRow[] = [];
  const seen = new Map<string, number>();
  const width = header.cells.length;
  for (const rec of records) {
    const rowErrors: CsvIssue[] = [];
    const add = (key: ColumnKey | undefined, message: string) => rowErrors.push({ line: rec.line, ...(key ? { column: cols.get(key)?.title } : {}), message });
    if (rec.cells.length > width)
      add(undefined, `The row has ${rec.cells.length} values but the header has ${width} columns${sep === "," ? " (a decimal comma splits a value: quote it, or use semicolons as the separator)" : ""}`);
    const cell = (k: ColumnKey) => {
      const c = cols.get(k);
      return c ? (rec.cells[c.index] ?? "").trim() : "";
    };
    const numberOf = (k: ColumnKey, what: string): number | undefined => {
      const t = cell(k);
      if (t === "") {
        add(k, `${what} is empty`);
        return undefined;
      }
      const n = parseTableNumber(t);
      if (!Number.isFinite(n)) {
        add(k, `${what} "${t}" is not a number`);
        return undefined;
      }
      return n;
    };
    let size_m2: number | undefined;
    const sizeText = cell("size");
    if (sizeText === "") add("size", "Size is empty");
    else {
      const v = sizeToM2(sizeText, size!.size!);
      if (typeof v === "string") add("size", v);
      else size_m2 = v;
    }
    const matText = cell("material").toLowerCase();
    const material = MATERIAL_ALIASES[matText];
    if (!material) add("material", matText === "" ? "Material is empty (copper or aluminium)" : `Material "${cell("material")}" is not copper or aluminium (Cu, Al and aluminum are read too)`);
    const insText = cell("insulation").toLowerCase().replace(/\s+/g, "-");
    const insulation = (TABLE_INSULATIONS as readonly string[]).includes(insText) ? (insText as (typeof TABLE_INSULATIONS)[number]) : undefined;
    if (!insulation) add("insulation", insText === "" ? `Insulation is empty (one of ${TABLE_INSULATIONS.join(", ")})` : `Insulation "${cell("insulation")}" is not one of ${TABLE_INSULATIONS.join(", ")}`);
    const installation = cell("installation");
    if (installation === "") add("installation", "Installation method is empty");
    else if (installation.length > 40) add("installation", `Installation method "${installation.slice(0, 20)}…" is longer than 40 characters`);
    const ambRaw = numberOf("referenceAmbient", "Reference ambient");
    const ampacity = numberOf("ampacity", "Amps");
    let conductorMax: number | undefined;
    if (cols.has("conductorMax") && cell("conductorMax") !== "") {
      const m = numberOf("conductorMax", "Conductor maximum temperature");
      if (m !== undefined) conductorMax = tempToC(m, cols.get("conductorMax")!.temp!);
    } else if (insulation) {
      conductorMax = INSULATION_DEFAULT_MAX_C[insulation];
      if (conductorMax === undefined) add("conductorMax", 'Insulation "other" needs a conductor maximum temperature column (°C or °F)');
    }
    const label = cell("label");
    if (rowErrors.length === 0) {
      const parsed = ampacityRowSchema.safeParse({
        size_m2,
        ...(label ? { label } : {}),
        material,
        insulation,
        installation,
        referenceAmbient_C: tempToC(ambRaw!, amb.temp!),
        conductorMax_C: conductorMax,
        ampacity_A: ampacity,
      });
      if (!parsed.success) {
        const byField: Record<string, ColumnKey> = { size_m2: "size", label: "label", referenceAmbient_C: "referenceAmbient", conductorMax_C: "conductorMax", ampacity_A: "ampacity" };
        for (const iss of parsed.error.issues) add(byField[String(iss.path[0])], iss.message);
      } else {
        const r = parsed.data;
        if (r.referenceAmbient_C >= r.conductorMax_C) add("referenceAmbient", `Reference ambient ${r.referenceAmbient_C} °C is not below the conductor maximum ${r.conductorMax_C} °C`);
        else {
          const key = [r.size_m2.toPrecision(SIZE_PRECISION), r.material, r.insulation, r.installation.toLowerCase()].join("|");
          const first = seen.get(key);
          if (first !== undefined)
            add(undefined, `Duplicate row: line ${first} has the same size, material, insulation and installation method (${label || sizeText}, ${r.material}, ${r.insulation}, "${r.installation}")`);
          else {
            seen.set(key, rec.line);
            rows.push(r);
          }
        }
      }
    }
    errors.push(...rowErrors);
  }
  return { rows: errors.length ? [] : rows, errors, notes };
}

/** One problem in plain words: "Line 7, column “amps”: Amps "x" is not a number". */
export function formatCsvIssue(e: CsvIssue): string {
  return `Line ${e.line}${e.column ? `, column "${e.column}"` : ""}: ${e.message}`;
}

/**
 * Parses a CSV table (see parseAmpacityCsvDetailed) into an AmpacityTable, or throws one
 * EngineError listing every problem.
 */
export function parseAmpacityCsv(name: string, csv: string, source?: string): AmpacityTable {
  const r = parseAmpacityCsvDetailed(csv);
  if (r.errors.length > 0) throw new EngineError("csv-invalid", `The table was not read (${r.errors.length} problem${r.errors.length === 1 ? "" : "s"}): ${r.errors.map(formatCsvIssue).join("; ")}`, "csv");
  return ampacityTableSchema.parse({ name, source, rows: r.rows });
}
