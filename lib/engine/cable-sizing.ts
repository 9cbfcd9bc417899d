/**
 * Cable sizing: the smallest standard size and number in parallel (1…8) whose corrected
 * current-carrying capacity carries the load (I_B ≤ I_z, IEC 60364-4-43:2008 §433.1 a) and
 * whose voltage drop meets the limit (IEC 60364-5-52:2009 §525 and Annex G).
 * Capacity comes either from the IEC 60287 free-air rating or from an organisation's table.
 */
import { z } from "zod";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";
import { material, MATERIAL_IDS } from "./materials";
import { cableAmpacity, CABLE_INSULATIONS, FREE_AIR_ARRANGEMENTS } from "./cable-ampacity";
import { ampacityFromTable, ampacityTableSchema, GROUPING_ARRANGEMENTS, tableSizes } from "./ampacity-table";
import {
  applicableLimitPercent,
  feederDropPercent,
  SIZE_SERIES,
  standardSizes,
  SUPPLY_SYSTEMS,
  VOLTAGE_DROP_LIMIT_IDS,
  voltageDropInputSchema,
  voltageDropLimit,
  conductorTemperatureAtLoad,
} from "./voltage-drop";

const freeAirSchema = z.object({
  source: z.literal("free-air"),
  cores: int("Cores per cable", 1, 5).default(3),
  loadedConductors: int("Loaded conductors per cable", 1, 4).optional(),
  arrangement: choice("Arrangement in air", FREE_AIR_ARRANGEMENTS).default("single"),
  /** Further derating (grouping of several circuits, organisation practice); multiplies I_z. */
  deratingFactor: num("Derating factor", "", 0, 1, { exclusiveMin: true }).default(1),
});

const tableSchema = z.object({
  source: z.literal("table"),
  table: ampacityTableSchema,
  installation: z.string().trim().min(1, { message: "Installation method is required (1 to 40 characters)" }).max(40),
  groupingFactor: num("Grouping factor", "", 0, 1, { exclusiveMin: true }).optional(),
  grouping: z.object({ arrangement: choice("Grouping arrangement", GROUPING_ARRANGEMENTS), circuits: int("Number of circuits", 1, 100) }).optional(),
});

export const cableSizingInputSchema = z.object({
  system: choice("Supply system", SUPPLY_SYSTEMS),
  nominalVoltage_V: num("Nominal voltage", "V", 1, 100_000, { exclusiveMin: true }),
  voltageAt: choice("Voltage given at", ["sending", "receiving"] as const).default("sending"),
  current_A: num("Load current", "A", 0, 100_000, { exclusiveMin: true }),
  powerFactor: num("Power factor", "", 0, 1).default(1),
  leading: z.boolean().default(false),
  frequency_Hz: num("Frequency", "Hz", 0, 1000).default(50),
  length_m: num("Route length", "m", 0, 100_000),
  materialId: choice("Conductor material", MATERIAL_IDS).default("cu-annealed"),
  insulation: choice("Insulation", CABLE_INSULATIONS).default("xlpe"),
  ambient_C: num("Ambient temperature", "°C", -40, 80).default(30),
  reactance_ohm_per_m: num("Reactance", "Ω/m", 0, 0.01).optional(),
  method: choice("Voltage-drop method", ["approximate", "exact"] as const).default("exact"),
  limitId: choice("Voltage-drop limit", VOLTAGE_DROP_LIMIT_IDS).default("iec-a-other"),
  limitPercent: num("Voltage-drop limit", "%", 0, 50, { exclusiveMin: true }).optional(),
  upstreamDrop_percent: num("Upstream voltage drop", "%", 0, 50).default(0),
  sizeSeries: choice("Standard size series", SIZE_SERIES).default("iec-60228"),
  maxParallel: int("Largest number in parallel", 1, 8).default(8),
  /** Largest size allowed per conductor (organisation practice), m². */
  maxSize_m2: num("Largest conductor size", "m²", 0, 0.002, { exclusiveMin: true }).optional(),
  /** Evaluate the drop at θ_max instead of at the load temperature. */
  dropAtMaxTemperature: z.boolean().default(false),
  installation: z.discriminatedUnion("source", [freeAirSchema, tableSchema], { error: () => 'Installation source must be "free-air" or "table"' }),
});

export type CableSizingInput = z.input<typeof cableSizingInputSchema>;
type Parsed = z.output<typeof cableSizingInputSchema>;

export interface SizingCandidate {
  parallel: number;
  label: string;
  area_m2: number;
  /** Capacity of one conductor (or cable) after corrections, A. */
  ampacityEach_A: number;
  /** Capacity of the phase, parallel conductors together, A. */
  ampacity_A: number;
  /** (I_z − I_B)/I_z. */
  ampacityMargin: number;
  conductorTemperature_C: number;
  drop_percent: number;
  /** (limit − drop)/limit, with the upstream drop included. */
  dropMargin: number;
  governedBy: "ampacity" | "voltage drop";
}

export interface CableSizingResults {
  selected: SizingCandidate | null;
  /** The smallest passing size for each number in parallel. */
  candidates: SizingCandidate[];
  limit_percent: number;
  selectionRule: string;
  ampacitySource: string;
}

interface SizeRow {
  label: string;
  area_m2: number;
  ampacityEach_A: number;
}

function sizeRows(v: Parsed, warnings: Warning[]): { rows: SizeRow[]; thetaMax: number; source: string } {
  const metal = material(v.materialId).metal;
  const inst = v.installation;
  if (inst.source === "free-air") {
    let thetaMax = Number.NaN;
    const rows = standardSizes(v.sizeSeries, metal)
      .filter((s) => s.area_m2 <= 0.002)
      .map((s) => {
        const r = cableAmpacity({
          materialId: v.materialId,
          area_m2: s.area_m2,
          insulation: v.insulation,
          cores: inst.cores,
          loadedConductors: inst.loadedConductors,
          arrangement: inst.arrangement,
          ambient_C: v.ambient_C,
          frequency_Hz: v.frequency_Hz,
        });
        thetaMax = r.results.thetaMax_C;
        return { label: s.label, area_m2: s.area_m2, ampacityEach_A: r.results.ampacity_A * inst.deratingFactor };
      });
    return { rows, thetaMax, source: `IEC 60287-1-1/-2-1 free air (${inst.arrangement}, ${inst.cores}-core)${inst.deratingFactor !== 1 ? `, × derating ${inst.deratingFactor}` : ""}` };
  }
  const areas = tableSizes(inst.table, metal, v.insulation, inst.installation);
  if (areas.length === 0)
    throw new EngineError("no-table-rows", `Table "${inst.table.name}" has no rows for ${metal} ${v.insulation} in installation "${inst.installation}"`, "installation.installation");
  let thetaMax = Number.NaN;
  const rows = areas.map((a) => {
    const r = ampacityFromTable({ table: inst.table, size_m2: a, material: metal, insulation: v.insulation, installation: inst.installation, ambient_C: v.ambient_C, groupingFactor: inst.groupingFactor, grouping: inst.grouping });
    for (const w of r.warnings) if (!warnings.some((x) => x.code === w.code)) warnings.push(w);
    thetaMax = r.results.row.conductorMax_C;
    return { label: r.results.row.label ?? `${+(a * 1e6).toPrecision(4)} mm²`, area_m2: a, ampacityEach_A: r.results.corrected_A };
  });
  return { rows, thetaMax, source: `organisation table "${inst.table.name}" (${inst.installation})` };
}

const FORMULAS: Formula[] = [
  { id: "ib-iz", expression: "I_B ≤ I_z = n·I_z,each", source: "IEC 60364-4-43:2008 §433.1 a); parallel conductors share equally, IEC 60364-4-43 §433.4 (equal construction and route)" },
  { id: "theta-load", expression: "θ = θa + (θmax − θa)·(I_B/I_z)²", source: "Common practice (losses ∝ I²)" },
  { id: "drop", expression: "Δu ≤ Δu_max (voltage-drop calculation per candidate)", source: "IEC 60364-5-52:2009 §525, Annex G" },
];

export function cableSizing(input: CableSizingInput): CalcResult<CableSizingResults> {
  const v = cableSizingInputSchema.parse(input);
  const warnings: Warning[] = [];
  const { rows, thetaMax, source } = sizeRows(v, warnings);
  const limit_percent = v.limitPercent ?? applicableLimitPercent(v.limitId, v.length_m).percent;
  const allowed = rows.filter((r) => v.maxSize_m2 === undefined || r.area_m2 <= v.maxSize_m2 * (1 + 1e-9));

  const candidates: SizingCandidate[] = [];
  for (let n = 1; n <= v.maxParallel; n++) {
    for (const r of allowed) {
      const Iz = n * r.ampacityEach_A;
      if (!(Iz >= v.current_A)) continue;
      const theta = v.dropAtMaxTemperature ? thetaMax : conductorTemperatureAtLoad(v.ambient_C, thetaMax, v.current_A, Iz);
      const vd = voltageDropInputSchema.parse({
        system: v.system,
        nominalVoltage_V: v.nominalVoltage_V,
        voltageAt: v.voltageAt,
        current_A: v.current_A,
        powerFactor: v.powerFactor,
        leading: v.leading,
        frequency_Hz: v.frequency_Hz,
        length_m: v.length_m,
        materialId: v.materialId,
        area_m2: r.area_m2,
        parallel: n,
        reactance_ohm_per_m: v.reactance_ohm_per_m,
        insulation: v.insulation,
        ambient_C: v.ambient_C,
        temperatureBasis: "given",
        conductorTemperature_C: theta,
        method: v.method,
        limitPercent: limit_percent,
        upstreamDrop_percent: v.upstreamDrop_percent,
        sizeSeries: v.sizeSeries,
      });
      const drop = feederDropPercent(vd, r.area_m2, false);
      const total = drop + v.upstreamDrop_percent;
      if (!(Number.isFinite(drop) && total <= limit_percent)) continue;
      // Governed by whichever criterion the next smaller size fails.
      const idx = allowed.indexOf(r);
      const smaller = idx > 0 ? allowed[idx - 1] : undefined;
      const governedBy: SizingCandidate["governedBy"] = smaller && n * smaller.ampacityEach_A >= v.current_A ? "voltage drop" : "ampacity";
      candidates.push({
        parallel: n,
        label: r.label,
        area_m2: r.area_m2,
        ampacityEach_A: r.ampacityEach_A,
        ampacity_A: Iz,
        ampacityMargin: (Iz - v.current_A) / Iz,
        conductorTemperature_C: theta,
        drop_percent: drop,
        dropMargin: (limit_percent - total) / limit_percent,
        governedBy,
      });
      break;
    }
  }
  // Fewest conductors in parallel first (common practice: parallel paths only when one
  // conductor cannot do it, or the organisation caps the size with maxSize_m2), then the smallest size.
  const selected = candidates[0] ?? null;
  if (!selected) warnings.push({ code: "no-candidate", message: `No size up to ${v.maxParallel} in parallel meets both the capacity and the ${limit_percent.toFixed(2)} % drop limit.` });
  if (selected && selected.parallel > 1)
    warnings.push({ code: "parallel", message: "Parallel conductors: same material, section, length and route assumed so they share the current equally (IEC 60364-4-43 §433.4); mutual heating between the parallel cables is not in I_z unless a grouping factor is given." });
  if (v.system !== "dc-2w" && v.reactance_ohm_per_m === undefined) warnings.push({ code: "default-reactance", message: "Reactance not given: 0.08 mΩ/m per conductor assumed (IEC 60364-5-52 Annex G)." });
  const limitSource = v.limitPercent !== undefined ? "organisation override" : voltageDropLimit(v.limitId).name;

  return {
    kind: "cable-sizing",
    engineVersion: ENGINE_VERSION,
    results: {
      selected,
      candidates,
      limit_percent,
      selectionRule: "fewest conductors in parallel, then the smallest standard size meeting both the capacity and the drop limit (common practice)",
      ampacitySource: source,
    },
    intermediates: {
      IB: q("Load current I_B", v.current_A, "A"),
      limit: q(`Voltage-drop limit (${limitSource})`, limit_percent, "%"),
      thetaMax: q("Maximum conductor temperature", thetaMax, "°C"),
      ...(selected ? { Iz: q("Selected I_z", selected.ampacity_A, "A"), drop: q("Selected drop", selected.drop_percent, "%") } : {}),
    },
    formulas: FORMULAS,
    warnings,
    checks: selected
      ? [
          check("ampacity", "Load current ≤ capacity", v.current_A, selected.ampacity_A, "A"),
          check("voltage-drop", "Voltage drop", selected.drop_percent + v.upstreamDrop_percent, limit_percent, "%"),
        ]
      : [],
  };
}
