/**
 * An organisation's own ampacity table (size, material, insulation, installation method,
 * reference ambient, amps) and its lookup with the ambient-temperature and grouping
 * corrections applied.
 */
import { z } from "zod";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";

export const TABLE_METALS = ["copper", "aluminium"] as const;
export const TABLE_INSULATIONS = ["pvc", "xlpe", "epr", "rubber-60", "thhn", "thwn", "xhhw", "other"] as const;

export const ampacityRowSchema = z.object({
  size_m2: num("Conductor size", "m²", 0, 0.01, { exclusiveMin: true }),
  /** Optional label as the organisation writes it ("95 mm²", "4/0"). */
  label: z.string().max(40).optional(),
  material: choice("Conductor material", TABLE_METALS),
  insulation: choice("Insulation", TABLE_INSULATIONS),
  /** Free text of the organisation's method code, e.g. "E", "F-trefoil", "tray". */
  installation: z.string().trim().min(1, { message: "Installation method is required (1 to 40 characters)" }).max(40, { message: "Installation method must be 1 to 40 characters" }),
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

/**
 * Parses a CSV table with the header
 * size_mm2,label,material,insulation,installation,reference_ambient_C,conductor_max_C,ampacity_A
 * into an AmpacityTable (sizes converted to m² here, at the edge). Lines starting with # are comments.
 */
export function parseAmpacityCsv(name: string, csv: string, source?: string): AmpacityTable {
  const lines = csv.split(/\r?\n/).filter((l) => l.trim() !== "" && !l.trim().startsWith("#"));
  const header = lines.shift()?.split(",").map((h) => h.trim());
  const want = ["size_mm2", "label", "material", "insulation", "installation", "reference_ambient_C", "conductor_max_C", "ampacity_A"];
  if (!header || want.some((w, i) => header[i] !== w)) throw new EngineError("csv-header", `CSV header must be: ${want.join(",")}`, "csv");
  const rows = lines.map((l) => {
    const c = l.split(",").map((x) => x.trim());
    return {
      size_m2: Number(c[0]) * 1e-6,
      label: c[1] || undefined,
      material: c[2],
      insulation: c[3],
      installation: c[4],
      referenceAmbient_C: Number(c[5]),
      conductorMax_C: Number(c[6]),
      ampacity_A: Number(c[7]),
    };
  });
  return ampacityTableSchema.parse({ name, source, rows });
}
