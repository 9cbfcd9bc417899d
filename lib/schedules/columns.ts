/**
 * The columns of a cable schedule: their names (with the aliases a person may write),
 * the units a header may carry, and the parsing of the header row. A header is
 * "name", "name (unit)" or "name [unit]"; a header without a unit means the column's
 * default unit. Pure: no database, no React.
 */
import { areaToKcmil, awgToArea_m2, KCMIL_MM2, lengthToM, tempToC, type LengthUnit, type TempUnit } from "@/lib/engine/units";

export const COLUMN_KEYS = [
  "tag",
  "from",
  "to",
  "material",
  "insulation",
  "size",
  "parallel",
  "length",
  "current",
  "powerFactor",
  "system",
  "voltage",
  "installation",
  "ampacity",
  "ambient",
  "grouping",
  "maxTemperature",
] as const;
export type ColumnKey = (typeof COLUMN_KEYS)[number];

/** How a unit in a header turns a cell's number into the column's SI value. */
export interface ColumnUnit {
  /** As printed in messages and exported headers. */
  symbol: string;
  toSI: (v: number) => number;
  fromSI: (v: number) => number;
}

export interface ColumnDef {
  key: ColumnKey;
  /** The name the template and the export use. */
  name: string;
  aliases: readonly string[];
  required: boolean;
  /** Units a header may carry (normalised spelling → unit); empty for text and plain numbers. */
  units: Readonly<Record<string, ColumnUnit>>;
  /** The unit meant when the header has none. */
  defaultUnit?: string;
  /** One line for the template and the page. */
  help: string;
}

const linear = (symbol: string, f: number): ColumnUnit => ({ symbol, toSI: (v) => v * f, fromSI: (v) => v / f });
const lengthUnit = (u: LengthUnit, symbol: string = u): ColumnUnit => ({ symbol, toSI: (v) => lengthToM(v, u), fromSI: (v) => v / lengthToM(1, u) });
const tempUnit = (u: TempUnit, symbol: string): ColumnUnit => ({
  symbol,
  toSI: (v) => tempToC(v, u),
  fromSI: (v) => (u === "C" ? v : u === "F" ? (v * 9) / 5 + 32 : v + 273.15),
});

const CELSIUS = tempUnit("C", "°C");
const TEMPERATURE_UNITS: Record<string, ColumnUnit> = { "°c": CELSIUS, c: CELSIUS, degc: CELSIUS, "deg c": CELSIUS, "°f": tempUnit("F", "°F"), f: tempUnit("F", "°F"), degf: tempUnit("F", "°F"), k: tempUnit("K", "K") };
const CURRENT_UNITS: Record<string, ColumnUnit> = { a: linear("A", 1), ka: linear("kA", 1e3), ma: linear("mA", 1e-3) };

/**
 * Size units: a bare number in the cell is read in the header's unit; a cell that names
 * its own size ("4/0", "250 kcmil", "10 AWG", "95 mm²") is read as written.
 * Under "AWG" a bare number is a gauge ("4" is 4 AWG, "0" is 1/0), not a scale factor.
 */
const KCMIL: ColumnUnit = { symbol: "kcmil", toSI: (v) => v * KCMIL_MM2 * 1e-6, fromSI: (v) => areaToKcmil(v) };
export const SIZE_UNITS: Record<string, ColumnUnit> = {
  mm2: linear("mm²", 1e-6),
  "sq mm": linear("mm²", 1e-6),
  kcmil: KCMIL,
  mcm: KCMIL,
  awg: { symbol: "AWG", toSI: (v) => awgToArea_m2(String(v)), fromSI: () => Number.NaN },
};

export const COLUMNS: readonly ColumnDef[] = [
  { key: "tag", name: "tag", aliases: ["cable tag", "feeder", "feeder tag", "cable"], required: true, units: {}, help: "Feeder or cable tag, 1 to 40 characters." },
  { key: "from", name: "from", aliases: ["source", "origin"], required: false, units: {}, help: "Where the feeder starts (text, up to 80 characters)." },
  { key: "to", name: "to", aliases: ["destination", "load end"], required: false, units: {}, help: "Where it ends (text, up to 80 characters)." },
  { key: "material", name: "material", aliases: ["conductor material", "conductor"], required: true, units: {}, help: "copper or aluminium (Cu, Al)." },
  { key: "insulation", name: "insulation", aliases: ["insulation type"], required: true, units: {}, help: "pvc, xlpe, epr, rubber-60, thhn, thwn, xhhw or other." },
  {
    key: "size",
    name: "size",
    aliases: ["conductor size", "cross-section", "cross section", "section", "csa"],
    required: true,
    units: SIZE_UNITS,
    defaultUnit: "mm2",
    help: "Cross-section of one conductor: a number in the header's unit (mm² unless it says kcmil or AWG), or a size written out: 95 mm2, 4/0, 2 AWG, 250 kcmil.",
  },
  { key: "parallel", name: "number in parallel", aliases: ["parallel", "in parallel", "conductors in parallel", "sets", "runs", "no. in parallel"], required: false, units: {}, help: "Conductors in parallel per phase, 1 to 8 (1 when empty)." },
  {
    key: "length",
    name: "length",
    aliases: ["route length", "cable length"],
    required: true,
    units: { m: lengthUnit("m"), mm: lengthUnit("mm"), cm: lengthUnit("cm"), km: lengthUnit("km"), ft: lengthUnit("ft"), in: lengthUnit("in"), yd: lengthUnit("yd"), mi: lengthUnit("mi") },
    defaultUnit: "m",
    help: "Route length (m unless the header says ft, km …).",
  },
  { key: "current", name: "load current", aliases: ["current", "ib", "design current", "load"], required: true, units: CURRENT_UNITS, defaultUnit: "a", help: "Design (load) current of the circuit, A." },
  { key: "powerFactor", name: "power factor", aliases: ["pf", "cos phi", "cos φ", "cosphi"], required: false, units: {}, help: "0 to 1, lagging; required for AC, ignored for DC." },
  {
    key: "system",
    name: "system",
    aliases: ["supply system", "supply"],
    required: true,
    units: {},
    help: "ac-3ph-4w, ac-3ph-3w, ac-1ph-2w or dc-2w (also 3ph-4w, 3ph-3w, 1ph, dc).",
  },
  { key: "voltage", name: "voltage", aliases: ["system voltage", "nominal voltage", "un"], required: true, units: { v: linear("V", 1), kv: linear("kV", 1e3) }, defaultUnit: "v", help: "Nominal voltage: line-to-line for three-phase, V (or kV in the header)." },
  {
    key: "installation",
    name: "installation method",
    aliases: ["installation", "method", "reference method"],
    required: false,
    units: {},
    help: "Method code of the chosen organisation ampacity table (looked up with material, insulation and size).",
  },
  { key: "ampacity", name: "ampacity", aliases: ["current-carrying capacity", "iz", "rating"], required: false, units: CURRENT_UNITS, defaultUnit: "a", help: "Ampacity of one conductor, used as given (times the number in parallel); leave empty to use the table." },
  { key: "ambient", name: "ambient", aliases: ["ambient temperature", "ta"], required: false, units: TEMPERATURE_UNITS, defaultUnit: "°c", help: "Ambient temperature (°C unless the header says °F or K); the project's design ambient when empty." },
  { key: "grouping", name: "grouping factor", aliases: ["grouping", "kg", "group factor"], required: false, units: {}, help: "Grouping factor applied to a table ampacity, above 0 up to 1 (1 when empty)." },
  {
    key: "maxTemperature",
    name: "max conductor temperature",
    aliases: ["max temperature", "conductor max temperature", "max temp", "θmax", "theta max"],
    required: false,
    units: TEMPERATURE_UNITS,
    defaultUnit: "°c",
    help: "Maximum continuous conductor temperature; needed only for insulation other than pvc, xlpe or epr when no table row gives it.",
  },
];

export const COLUMN_BY_KEY: Readonly<Record<ColumnKey, ColumnDef>> = Object.fromEntries(COLUMNS.map((c) => [c.key, c])) as Record<ColumnKey, ColumnDef>;

const normaliseName = (s: string) =>
  s
    .normalize("NFC")
    .toLowerCase()
    .replace(/[_\s]+/g, " ")
    .trim();

const NAME_TO_KEY: ReadonlyMap<string, ColumnKey> = new Map(COLUMNS.flatMap((c) => [c.name, ...c.aliases].map((n) => [normaliseName(n), c.key] as const)));

/** "mm²" → "mm2", "°C" stays "°c", "Deg C" → "deg c". */
export function normaliseUnit(u: string): string {
  return u
    .normalize("NFC")
    .trim()
    .toLowerCase()
    .replace(/²/g, "2")
    .replace(/\s+/g, " ")
    .replace(/^º/, "°");
}

/** The units a column accepts, as a person would read them. */
export function acceptedUnits(def: ColumnDef): string {
  return [...new Set(Object.values(def.units).map((u) => u.symbol))].join(", ");
}

export interface HeaderColumn {
  key: ColumnKey;
  /** Index of the cell in every row. */
  index: number;
  /** The header as written (for messages). */
  header: string;
  /** Normalised unit key into `COLUMN_BY_KEY[key].units`, or undefined for unitless columns. */
  unit: string | undefined;
}

export interface HeaderResult {
  columns: HeaderColumn[];
  /** Headers that are not schedule columns (results of an export, notes): ignored. */
  ignored: string[];
  /** File-level problems: a missing required column, an unknown unit, a column given twice. */
  errors: string[];
}

const UNIT_SUFFIX = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/;

/** Reads the header row: which cell is which column, in which unit. */
export function parseHeader(cells: readonly string[]): HeaderResult {
  const columns: HeaderColumn[] = [];
  const ignored: string[] = [];
  const errors: string[] = [];
  const seen = new Map<ColumnKey, string>();
  cells.forEach((raw, index) => {
    const header = raw.trim();
    if (header === "") return;
    const m = UNIT_SUFFIX.exec(header);
    const name = normaliseName(m ? m[1]! : header);
    const unitText = m ? m[2]! : undefined;
    const key = NAME_TO_KEY.get(name);
    if (!key) {
      ignored.push(header);
      return;
    }
    const def = COLUMN_BY_KEY[key];
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      errors.push(`Columns "${earlier}" and "${header}" are both the ${def.name} column; keep one.`);
      return;
    }
    seen.set(key, header);
    let unit: string | undefined = def.defaultUnit;
    if (unitText !== undefined && unitText !== "" && unitText !== "-") {
      const u = normaliseUnit(unitText);
      if (Object.keys(def.units).length === 0) {
        errors.push(`Column "${header}": ${def.name} takes no unit; write the header as "${def.name}".`);
        return;
      }
      if (!(u in def.units)) {
        errors.push(`Column "${header}": unit "${unitText}" is not accepted for ${def.name}; use one of ${acceptedUnits(def)}.`);
        return;
      }
      unit = u;
    }
    columns.push({ key, index, header, unit });
  });
  for (const def of COLUMNS) {
    if (def.required && !seen.has(def.key)) errors.push(`The header has no "${def.name}" column (it is required). Required columns: ${COLUMNS.filter((c) => c.required).map((c) => c.name).join(", ")}.`);
  }
  return { columns, ignored, errors };
}

/** Converts a number in a column's header unit to SI (m, m², A, V, °C). */
export function toSI(def: ColumnDef, unit: string | undefined, value: number): number {
  const u = unit ? def.units[unit] : undefined;
  return u ? u.toSI(value) : value;
}
