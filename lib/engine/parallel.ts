/**
 * Current sharing between parallel paths (kind "parallel-sharing"): N paths between
 * the same two points, each with its own material, section, length, number of
 * conductors in parallel, conductor temperature and (for AC) reactance per metre.
 *
 * DC: current divider by conductance, I_k = I·G_k/ΣG (Kirchhoff's laws).
 * AC: current divider by complex admittance, I_k = I·Y_k/ΣY with Y_k = 1/(R_k + jX_k),
 *     the total current taken as the reference phasor I∠0°.
 * Temperature of a path from its ampacity: θ = θ_a + (θ_max − θ_a)·(I/I_z)²
 * (steady-state heating ∝ I², common practice for cables and bars run below I_z).
 * Contingency: every path opened in turn, the remaining paths sharing the same current.
 */
import { z } from "zod";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Check, type Formula, type Warning } from "./core/result";
import { choice, fieldErrors, int, num } from "./core/schema";
import { MATERIAL_IDS, material } from "./materials";
import { dcResistancePerMetre } from "./resistance";

export const PARALLEL_LIMITS = { maxPaths: 50, minPaths: 2 } as const;

const pathSchema = z
  .object({
    name: z.string().trim().min(1, "path name is required").max(60, "path name must be at most 60 characters"),
    materialId: choice("material", MATERIAL_IDS),
    temperId: z.string().optional(),
    area_m2: num("cross-section", "m²", 0, 0.1, { exclusiveMin: true }),
    length_m: num("length", "m", 0, 10_000, { exclusiveMin: true }),
    count: int("conductors in parallel", 1, 100).default(1),
    conductorTemperature_C: num("conductor temperature", "°C", -40, 250).default(20),
    reactance_ohm_per_m: num("reactance per metre", "Ω/m", 0, 0.01).default(0),
    acResistanceFactor: num("AC resistance factor Rac/Rdc", "", 1, 5).default(1),
    ampacityPerConductor_A: num("ampacity per conductor", "A", 0, 100_000, { exclusiveMin: true }).optional(),
    maxTemperature_C: num("maximum conductor temperature", "°C", 0, 250).optional(),
  })
  .superRefine((p, ctx) => {
    if (p.temperId !== undefined && !material(p.materialId).tempers.some((t) => t.id === p.temperId)) {
      ctx.addIssue({
        code: "custom",
        path: ["temperId"],
        message: `temper must be one of: ${material(p.materialId).tempers.map((t) => t.id).join(", ")}`,
      });
    }
  });

export const parallelSharingInputSchema = z
  .object({
    mode: choice("mode", ["dc", "ac"] as const),
    current_A: num("total current", "A", 0, 1_000_000),
    ambient_C: num("ambient temperature", "°C", -40, 80).default(35),
    maxTemperature_C: num("maximum conductor temperature", "°C", 0, 250).default(90),
    paths: z
      .array(pathSchema)
      .min(PARALLEL_LIMITS.minPaths, `paths: at least ${PARALLEL_LIMITS.minPaths} paths are needed`)
      .max(PARALLEL_LIMITS.maxPaths, `paths: at most ${PARALLEL_LIMITS.maxPaths} paths are allowed`),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.paths.forEach((p, i) => {
      if (seen.has(p.name)) ctx.addIssue({ code: "custom", path: ["paths", i, "name"], message: `path name "${p.name}" is used twice` });
      seen.add(p.name);
      const tmax = p.maxTemperature_C ?? v.maxTemperature_C;
      if (p.ampacityPerConductor_A !== undefined && !(tmax > v.ambient_C))
        ctx.addIssue({ code: "custom", path: ["paths", i, "maxTemperature_C"], message: "maximum conductor temperature must be above the ambient temperature" });
    });
  });

export type ParallelSharingInput = z.input<typeof parallelSharingInputSchema>;
type ParsedInput = z.output<typeof parallelSharingInputSchema>;
type ParsedPath = ParsedInput["paths"][number];

export interface PathShare {
  name: string;
  /** Path resistance (all its conductors in parallel), Ω. */
  resistance_ohm: number;
  reactance_ohm: number;
  impedance_ohm: number;
  /** Current magnitude in the path, A. */
  current_A: number;
  /** Phase angle of the path current relative to the total current, degrees (0 for DC). */
  currentAngle_deg: number;
  currentPerConductor_A: number;
  /** |I_k|/|I|·100; for AC the shares may add to more than 100 % when the angles differ. */
  share_pct: number;
  loss_W: number;
  /** I/I_z per conductor, when an ampacity is given. */
  utilisation?: number;
  temperature_C?: number;
  temperatureRise_K?: number;
  overloaded?: boolean;
}

export interface ContingencyCase {
  /** The path that is open. */
  openPath: string;
  paths: { name: string; current_A: number; currentPerConductor_A: number; share_pct: number; utilisation?: number; overloaded?: boolean }[];
  overloaded: string[];
  /** Highest I/I_z among paths with an ampacity (undefined when none has one). */
  maxUtilisation?: number;
  maxCurrentPerConductor_A: number;
  totalLoss_W: number;
  voltageDrop_V: number;
}

export interface ParallelSharingResults {
  mode: "dc" | "ac";
  equivalentResistance_ohm: number;
  equivalentReactance_ohm: number;
  equivalentImpedance_ohm: number;
  /** |I·Z_eq|, the voltage across the parallel group, V. */
  voltageDrop_V: number;
  totalLoss_W: number;
  paths: PathShare[];
  anyOverloaded: boolean;
  contingencies: ContingencyCase[];
  /** The open path giving the highest utilisation (or, without ampacities, the highest current per conductor). */
  worstContingency: ContingencyCase;
}

interface PathImpedance {
  R: number;
  X: number;
}

function pathImpedance(p: ParsedPath, mode: "dc" | "ac"): PathImpedance {
  const rPerM = dcResistancePerMetre(p.materialId, p.area_m2, p.conductorTemperature_C, p.temperId);
  const acFactor = mode === "ac" ? p.acResistanceFactor : 1;
  const R = (rPerM * acFactor * p.length_m) / p.count;
  const X = mode === "ac" ? (p.reactance_ohm_per_m * p.length_m) / p.count : 0;
  return { R, X };
}

interface Divided {
  re: Float64Array;
  im: Float64Array;
  zeqR: number;
  zeqX: number;
}

/** I_k = I·Y_k/ΣY over the closed paths (open[k] true = path k removed). */
function divide(Z: PathImpedance[], I: number, open: number): Divided {
  const n = Z.length;
  const yr = new Float64Array(n);
  const yi = new Float64Array(n);
  let sr = 0;
  let si = 0;
  for (let k = 0; k < n; k++) {
    if (k === open) continue;
    const { R, X } = Z[k]!;
    const d = R * R + X * X;
    yr[k] = R / d;
    yi[k] = -X / d;
    sr += yr[k]!;
    si += yi[k]!;
  }
  const ss = sr * sr + si * si;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    // I·Y_k/ΣY with I real
    re[k] = (I * (yr[k]! * sr + yi[k]! * si)) / ss;
    im[k] = (I * (yi[k]! * sr - yr[k]! * si)) / ss;
  }
  return { re, im, zeqR: sr / ss, zeqX: -si / ss };
}

export function parallelSharing(raw: ParallelSharingInput): CalcResult<ParallelSharingResults> {
  const parsed = parallelSharingInputSchema.safeParse(raw);
  if (!parsed.success) {
    const [field, message] = Object.entries(fieldErrors(parsed.error))[0] ?? ["_", "invalid input"];
    throw new EngineError("invalid-input", message, field);
  }
  const input = parsed.data;
  const { mode, current_A: I, ambient_C } = input;
  const warnings: Warning[] = [];
  const checks: Check[] = [];
  const Z = input.paths.map((p) => pathImpedance(p, mode));
  if (mode === "dc" && input.paths.some((p) => p.reactance_ohm_per_m > 0))
    warnings.push({ code: "reactance-ignored", message: "Reactance per metre is ignored in DC mode." });

  const describe = (d: Divided, open: number) => {
    let totalLoss = 0;
    const rows = input.paths.map((p, k) => {
      const mag = k === open ? 0 : Math.hypot(d.re[k]!, d.im[k]!);
      const perCond = mag / p.count;
      const loss = mag * mag * Z[k]!.R;
      totalLoss += loss;
      const util = p.ampacityPerConductor_A !== undefined ? perCond / p.ampacityPerConductor_A : undefined;
      return { k, p, mag, perCond, loss, util };
    });
    return { rows, totalLoss, drop: I * Math.hypot(d.zeqR, d.zeqX) };
  };

  const base = divide(Z, I, -1);
  const baseRows = describe(base, -1);
  const paths: PathShare[] = baseRows.rows.map(({ k, p, mag, perCond, loss, util }) => {
    const out: PathShare = {
      name: p.name,
      resistance_ohm: Z[k]!.R,
      reactance_ohm: Z[k]!.X,
      impedance_ohm: Math.hypot(Z[k]!.R, Z[k]!.X),
      current_A: mag,
      currentAngle_deg: mag === 0 ? 0 : (Math.atan2(base.im[k]!, base.re[k]!) * 180) / Math.PI,
      currentPerConductor_A: perCond,
      share_pct: I === 0 ? 100 / input.paths.length : (mag / I) * 100,
      loss_W: loss,
    };
    if (util !== undefined) {
      const tmax = p.maxTemperature_C ?? input.maxTemperature_C;
      out.utilisation = util;
      out.temperatureRise_K = (tmax - ambient_C) * util * util;
      out.temperature_C = ambient_C + out.temperatureRise_K;
      out.overloaded = util > 1;
      checks.push(check(`ampacity-${k}`, `${p.name}: current per conductor ≤ ampacity`, perCond, p.ampacityPerConductor_A!, "A"));
      if (out.temperature_C > p.conductorTemperature_C + 5)
        warnings.push({
          code: "resistance-temperature",
          message: `${p.name}: estimated conductor temperature ${out.temperature_C.toFixed(1)} °C is above the ${p.conductorTemperature_C} °C used for its resistance; the sharing is computed with the lower resistance.`,
        });
    }
    return out;
  });

  const contingencies: ContingencyCase[] = input.paths.map((openPath, open) => {
    const d = divide(Z, I, open);
    const r = describe(d, open);
    const rows = r.rows
      .filter((row) => row.k !== open)
      .map(({ p, mag, perCond, util }) => ({
        name: p.name,
        current_A: mag,
        currentPerConductor_A: perCond,
        share_pct: I === 0 ? 0 : (mag / I) * 100,
        ...(util !== undefined ? { utilisation: util, overloaded: util > 1 } : {}),
      }));
    const utils = rows.flatMap((row) => (row.utilisation !== undefined ? [row.utilisation] : []));
    return {
      openPath: openPath.name,
      paths: rows,
      overloaded: rows.filter((row) => row.overloaded).map((row) => row.name),
      ...(utils.length ? { maxUtilisation: Math.max(...utils) } : {}),
      maxCurrentPerConductor_A: Math.max(...rows.map((row) => row.currentPerConductor_A)),
      totalLoss_W: r.totalLoss,
      voltageDrop_V: r.drop,
    };
  });
  const anyAmpacity = input.paths.some((p) => p.ampacityPerConductor_A !== undefined);
  const key = (c: ContingencyCase) => (anyAmpacity ? (c.maxUtilisation ?? 0) : c.maxCurrentPerConductor_A);
  const worstContingency = contingencies.reduce((a, b) => (key(b) > key(a) ? b : a));
  if (worstContingency.overloaded.length)
    warnings.push({
      code: "contingency-overload",
      message: `With ${worstContingency.openPath} open, ${worstContingency.overloaded.join(", ")} exceed their ampacity.`,
    });
  if (!anyAmpacity) warnings.push({ code: "no-ampacity", message: "No ampacity given: temperatures and overloads are not assessed." });

  const formulas: Formula[] = [
    { id: "r-path", expression: "R_k = ρ_20·(β + θ_k)/(β + 20)·L_k/(A_k·n_k)", source: "IEC 60287-1-1:2006 §2.1.1 (resistivity at temperature); n_k conductors in parallel" },
    mode === "dc"
      ? { id: "divider", expression: "I_k = I·G_k/ΣG, G_k = 1/R_k", source: "Kirchhoff's current and voltage laws (current divider)" }
      : { id: "divider", expression: "I_k = I·Y_k/ΣY, Y_k = 1/(R_k + jX_k), I = I∠0°", source: "Kirchhoff's laws in phasor form (current divider)" },
    { id: "loss", expression: "P_k = |I_k|²·R_k", source: "Joule's law" },
    ...(anyAmpacity ? [{ id: "temperature", expression: "θ_k = θ_a + (θ_max − θ_a)·(I_k/(n_k·I_z))²", source: "common practice (steady-state heating proportional to I²)" }] : []),
    { id: "contingency", expression: "each path k opened in turn; remaining paths share I by the same divider", source: "common practice (N−1 check)" },
  ];

  const intermediates = {
    equivalentResistance: q("Equivalent resistance R_eq", base.zeqR, "Ω"),
    equivalentReactance: q("Equivalent reactance X_eq", base.zeqX, "Ω"),
    voltageDrop: q("Voltage across the parallel group", baseRows.drop, "V"),
    totalLoss: q("Total loss", baseRows.totalLoss, "W"),
  };

  return {
    kind: "parallel-sharing",
    engineVersion: ENGINE_VERSION,
    results: {
      mode,
      equivalentResistance_ohm: base.zeqR,
      equivalentReactance_ohm: base.zeqX,
      equivalentImpedance_ohm: Math.hypot(base.zeqR, base.zeqX),
      voltageDrop_V: baseRows.drop,
      totalLoss_W: baseRows.totalLoss,
      paths,
      anyOverloaded: paths.some((p) => p.overloaded),
      contingencies,
      worstContingency,
    },
    intermediates,
    formulas,
    warnings,
    checks,
  };
}
