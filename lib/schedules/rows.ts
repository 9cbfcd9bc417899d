/**
 * Validation of one schedule row with zod. Every message names the row, the column (as
 * its header is written) and the allowed range in the header's unit. Numbers are checked
 * in the unit the header gives, then converted to SI. Pure.
 */
import { z } from "zod";
import { choice, num } from "@/lib/engine/core/schema";
import { TABLE_INSULATIONS } from "@/lib/engine/ampacity-table";
import { awgToArea_m2, parseConductorSize } from "@/lib/engine/units";
import type { SupplySystem } from "@/lib/engine/voltage-drop";
import { COLUMN_BY_KEY, toSI, type ColumnKey, type HeaderColumn } from "./columns";
import { METALS, type ScheduleError, type ScheduleMetal, type ScheduleRowInput } from "./types";

/** SI ranges, the engine's own (lib/engine/voltage-drop.ts and ampacity-table.ts). */
const RANGES = {
  length: { min: 0, max: 100_000, exclusiveMin: true },
  current: { min: 0, max: 100_000, exclusiveMin: false },
  voltage: { min: 1, max: 100_000, exclusiveMin: true },
  ampacity: { min: 0, max: 100_000, exclusiveMin: true },
  ambient: { min: -40, max: 80, exclusiveMin: false },
  maxTemperature: { min: 40, max: 250, exclusiveMin: false },
} as const;

/** Largest section the voltage-drop engine takes, m² (10 000 mm²). */
const MAX_SIZE_M2 = 0.01;

/** Formula-looking cells are exported with a leading quote; a re-import takes it off again. */
const NEUTRALISED = /^'(?=[=+\-@\t\r])/;

export function unneutralise(cell: string): string {
  return cell.replace(NEUTRALISED, "");
}

/**
 * "1,5" → "1.5" and "2,5 mm2" → "2.5 mm2" in a decimal-comma file. A number with both a
 * comma and a point ("1.234,5", thousands separators) is left as written, to be refused.
 */
function decimal(cell: string, decimalComma: boolean): string {
  const t = cell.trim();
  if (!decimalComma || t.includes(".") || (t.match(/,/g) ?? []).length !== 1) return t;
  return t.replace(/(\d?),(\d)/, "$1.$2");
}

const TEXT_KEYS: ReadonlySet<ColumnKey> = new Set(["tag", "from", "to", "material", "insulation", "system", "installation"]);

const tidy = (x: number) => {
  const r = Number(x.toPrecision(6));
  return Object.is(r, -0) ? 0 : r;
};

const SYSTEM_ALIASES: Record<string, SupplySystem> = {
  "ac-3ph-4w": "ac-3ph-4w",
  "3ph-4w": "ac-3ph-4w",
  "3ph4w": "ac-3ph-4w",
  "ac-3ph-3w": "ac-3ph-3w",
  "3ph-3w": "ac-3ph-3w",
  "3ph3w": "ac-3ph-3w",
  "ac-1ph-2w": "ac-1ph-2w",
  "1ph-2w": "ac-1ph-2w",
  "1ph": "ac-1ph-2w",
  "dc-2w": "dc-2w",
  dc: "dc-2w",
};
const METAL_ALIASES: Record<string, ScheduleMetal> = { copper: "copper", cu: "copper", aluminium: "aluminium", aluminum: "aluminium", al: "aluminium" };

const SYSTEM_LIST = "ac-3ph-4w, ac-3ph-3w, ac-1ph-2w, dc-2w (or 3ph-4w, 3ph-3w, 1ph, dc)";

/** A text cell with a length limit. */
function textField(label: string, min: number, max: number) {
  return z
    .string()
    .trim()
    .refine((s) => s.length >= min, { message: min > 0 ? `${label} is required (${min} to ${max} characters)` : `${label} is required` })
    .refine((s) => s.length <= max, { message: `${label} must be at most ${max} characters` });
}

function aliasField<T extends string>(label: string, aliases: Record<string, T>, list: string) {
  return z.string().transform((s, ctx) => {
    const v = aliases[s.trim().toLowerCase()];
    if (v === undefined) {
      ctx.addIssue({ code: "custom", message: s.trim() === "" ? `${label} is required (${list})` : `${label} must be one of: ${list}; got "${s.trim().slice(0, 40)}"` });
      return z.NEVER;
    }
    return v;
  });
}

/** A number column in its header unit: the SI range converted to that unit for the message. */
function numberField(col: HeaderColumn, range: { min: number; max: number; exclusiveMin: boolean }) {
  const def = COLUMN_BY_KEY[col.key];
  const u = col.unit ? def.units[col.unit] : undefined;
  const lo = u ? tidy(u.fromSI(range.min)) : range.min;
  const hi = u ? tidy(u.fromSI(range.max)) : range.max;
  return num(col.header, u?.symbol ?? "", Math.min(lo, hi), Math.max(lo, hi), { exclusiveMin: range.exclusiveMin });
}

interface SizeValue {
  text: string;
  label: string;
  series: "iec-60228" | "awg-kcmil";
  area_m2: number;
}

/** A size cell: a bare number in the header's unit, or a size written with its own unit. */
function sizeField(col: HeaderColumn | undefined, label: string) {
  const unit = col?.unit ?? "mm2";
  return z.string().transform((raw, ctx): SizeValue => {
    const text = raw.trim();
    const fail = (message: string) => {
      ctx.addIssue({ code: "custom", message });
      return z.NEVER;
    };
    if (text === "") return fail(`${label} is required: a number in ${unit === "awg" ? "AWG" : unit === "mm2" || unit === "sq mm" ? "mm²" : "kcmil"}, or a size such as 95 mm2, 4/0, 2 AWG, 250 kcmil`);
    const bare = text.replace(/\s+/g, "");
    let area: number;
    let shown: string;
    let series: SizeValue["series"];
    try {
      if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(bare)) {
        const n = Number(bare);
        if (unit === "awg") {
          area = awgToArea_m2(bare);
          shown = `${Number(bare) === 0 ? "1/0" : bare} AWG`;
          series = "awg-kcmil";
        } else {
          if (!(n > 0) || !Number.isFinite(n)) return fail(`${label} must be above 0 (got ${text})`);
          area = toSI(COLUMN_BY_KEY.size, unit, n);
          const kcmil = unit === "kcmil" || unit === "mcm";
          shown = kcmil ? `${n} kcmil` : `${n} mm²`;
          series = kcmil ? "awg-kcmil" : "iec-60228";
        }
      } else {
        area = parseConductorSize(text);
        const t = text.toLowerCase();
        series = /mm|sq/.test(t) ? "iec-60228" : "awg-kcmil";
        shown = /kcmil|mcm/.test(t) ? `${parseFloat(t)} kcmil` : series === "iec-60228" ? `${parseFloat(t)} mm²` : `${t.replace(/\s*awg$/, "").toUpperCase()} AWG`;
      }
    } catch (err) {
      return fail(`${label}: ${err instanceof Error ? err.message : "not a conductor size"}`);
    }
    if (!(area > 0) || !Number.isFinite(area)) return fail(`${label} must be above 0 (got ${text})`);
    if (area > MAX_SIZE_M2) return fail(`${label} must be at most 10000 mm² (got ${text}, ${tidy(area * 1e6)} mm²)`);
    return { text, label: shown, series, area_m2: area };
  });
}

export interface RowContext {
  columns: HeaderColumn[];
  decimalComma: boolean;
}

/** The zod schema of a row for this file's header (columns and units). */
export function rowSchema(columns: readonly HeaderColumn[]) {
  const byKey = new Map(columns.map((c) => [c.key, c] as const));
  const header = (k: ColumnKey) => byKey.get(k)?.header ?? COLUMN_BY_KEY[k].name;
  const numberOf = (k: keyof typeof RANGES) => {
    const col = byKey.get(k) ?? { key: k, index: -1, header: COLUMN_BY_KEY[k].name, unit: COLUMN_BY_KEY[k].defaultUnit };
    return numberField(col, RANGES[k]);
  };
  return z
    .object({
      tag: textField(header("tag"), 1, 40),
      from: textField(header("from"), 0, 80),
      to: textField(header("to"), 0, 80),
      material: aliasField(header("material"), METAL_ALIASES, METALS.join(", ")),
      insulation: z.string().transform((s) => s.trim().toLowerCase()).pipe(choice(header("insulation"), TABLE_INSULATIONS)),
      size: sizeField(byKey.get("size"), header("size")),
      parallel: num(header("parallel"), "", 1, 8)
        .refine((n) => Number.isInteger(n), { message: `${header("parallel")} must be a whole number from 1 to 8` })
        .optional(),
      length: numberOf("length"),
      current: numberOf("current"),
      powerFactor: num(header("powerFactor"), "", 0, 1).optional(),
      system: aliasField(header("system"), SYSTEM_ALIASES, SYSTEM_LIST),
      voltage: numberOf("voltage"),
      installation: textField(header("installation"), 0, 40),
      ampacity: numberOf("ampacity").optional(),
      ambient: numberOf("ambient").optional(),
      grouping: num(header("grouping"), "", 0, 1, { exclusiveMin: true }).optional(),
      maxTemperature: numberOf("maxTemperature").optional(),
    })
    .superRefine((v, ctx) => {
      if (v.system !== "dc-2w" && v.powerFactor === undefined)
        ctx.addIssue({ code: "custom", path: ["powerFactor"], message: `${header("powerFactor")} is required for an AC system (0 to 1)` });
    });
}

export type RowSchema = ReturnType<typeof rowSchema>;

/** The cells of one record by column key, prepared for the schema (quote of an export taken off, decimal comma read). */
function cellsOf(cells: readonly string[], ctx: RowContext): Record<string, string | undefined> {
  const out: Record<string, string | undefined> = {};
  for (const c of ctx.columns) {
    const raw = unneutralise(cells[c.index] ?? "");
    if (TEXT_KEYS.has(c.key)) out[c.key] = raw;
    else if (c.key === "size") out[c.key] = decimal(raw, ctx.decimalComma);
    else {
      const v = decimal(raw, ctx.decimalComma);
      out[c.key] = v === "" ? undefined : v;
    }
  }
  for (const k of ["tag", "from", "to", "material", "insulation", "size", "system", "installation"]) out[k] ??= "";
  return out;
}

export type RowOutcome = { ok: true; value: ScheduleRowInput } | { ok: false; errors: ScheduleError[] };

/** Validates one record; errors name the row and the column. */
export function validateRow(schema: RowSchema, row: number, cells: readonly string[], ctx: RowContext, headerCount: number): RowOutcome {
  const extra = cells.slice(headerCount).some((c) => c.trim() !== "");
  if (extra) {
    const hint = ctx.decimalComma ? "" : " With comma separators a decimal comma (1,5) splits a number in two: write 1.5, or save the file with semicolons.";
    return { ok: false, errors: [{ row, column: "", message: `Row ${row} has ${cells.length} cells but the header has ${headerCount}: a cell holds a separator that is not inside quotes.${hint}` }] };
  }
  const parsed = schema.safeParse(cellsOf(cells, ctx));
  if (!parsed.success) {
    const byKey = new Map(ctx.columns.map((c) => [c.key as string, c.header] as const));
    const seen = new Set<string>();
    const errors: ScheduleError[] = [];
    for (const issue of parsed.error.issues) {
      const key = String(issue.path[0] ?? "");
      if (seen.has(key)) continue;
      seen.add(key);
      const column = byKey.get(key) ?? (key in COLUMN_BY_KEY ? COLUMN_BY_KEY[key as ColumnKey].name : "");
      errors.push({ row, column, message: `Row ${row}, column "${column}": ${issue.message}.`.replace(/\.\.$/, ".") });
    }
    return { ok: false, errors };
  }
  const v = parsed.data;
  const unitOf = (k: ColumnKey) => ctx.columns.find((c) => c.key === k)?.unit ?? COLUMN_BY_KEY[k].defaultUnit;
  const si = (k: ColumnKey, x: number) => toSI(COLUMN_BY_KEY[k], unitOf(k), x);
  return {
    ok: true,
    value: {
      row,
      tag: v.tag,
      from: v.from,
      to: v.to,
      material: v.material,
      insulation: v.insulation,
      sizeText: v.size.text,
      sizeLabel: v.size.label,
      sizeSeries: v.size.series,
      size_m2: v.size.area_m2,
      parallel: v.parallel ?? 1,
      length_m: si("length", v.length),
      current_A: si("current", v.current),
      powerFactor: v.system === "dc-2w" ? null : (v.powerFactor ?? null),
      system: v.system,
      voltage_V: si("voltage", v.voltage),
      installation: v.installation,
      ampacityGiven_A: v.ampacity === undefined ? null : si("ampacity", v.ampacity),
      ambient_C: v.ambient === undefined ? null : si("ambient", v.ambient),
      grouping: v.grouping ?? null,
      maxTemperature_C: v.maxTemperature === undefined ? null : si("maxTemperature", v.maxTemperature),
    },
  };
}
