/**
 * DC and AC resistance of conductors: round solid/stranded, flat bars and bar packs.
 */
import { z } from "zod";
import { EngineError, q, type CalcResult, type Formula, type Quantity, type Warning, ENGINE_VERSION } from "./core/result";
import { choice, int, num } from "./core/schema";
import { iec60228MaxResistance, type Iec60228Class } from "./conductors";
import { BAR_ORIENTATIONS, type BarArrangement } from "./geometry";
import { barArrangementAc, type BarArrangementAcResult } from "./filament";
import { MATERIAL_IDS, material, resistivity20, resistivityAt, temper } from "./materials";
import { awgToArea_m2, kcmilToArea_m2 } from "./units";

/**
 * DC resistance per metre of a conductor of cross-section `area_m2` at θ °C, from the
 * material's resistivity (temper conductivity where the product standard gives one):
 * R_θ = ρ_20·(β + θ)/((β + 20)·A) — IEC 60287-1-1:2006 §2.1.1.
 * No stranding allowance: this is the solid section (a bar, a rod, a solid wire).
 */
export function dcResistancePerMetre(materialId: string, area_m2: number, theta_C: number, temperId?: string): number {
  if (!(area_m2 > 0) || !Number.isFinite(area_m2)) throw new RangeError(`area must be a positive number of m², got ${area_m2}`);
  return resistivityAt(material(materialId), theta_C, temperId) / area_m2;
}

// ---------------------------------------------------------------------------------
// Round conductors — DC
// ---------------------------------------------------------------------------------

export type RoundConstruction = "solid" | "stranded" | "compacted" | "flexible";
export const ROUND_CONSTRUCTIONS = ["solid", "stranded", "compacted", "flexible"] as const;

/** IEC 60228 class of each construction: solid → class 1, stranded and compacted → class 2, flexible → class 5. */
export const IEC60228_CLASS_OF: Record<RoundConstruction, Iec60228Class> = { solid: 1, stranded: 2, compacted: 2, flexible: 5 };

/**
 * Allowance for the longer path of helically laid strands when the resistance comes
 * from resistivity (a size outside IEC 60228): 2 % for stranded conductors — common
 * practice; it reproduces NFPA 70 Chapter 9 Table 8 (stranded vs solid) within 0.5 %.
 */
export const STRANDING_ALLOWANCE: Record<RoundConstruction, number> = { solid: 1, stranded: 1.02, compacted: 1.02, flexible: 1.02 };

export interface RoundDcInput {
  materialId: string;
  temperId?: string;
  area_m2: number;
  theta_C: number;
  construction: RoundConstruction;
  /** true when area_m2 is a nominal metric size (then IEC 60228 maxima are used where tabulated). */
  nominalMetric?: boolean;
}

export interface RoundDcResult {
  r20_ohm_m: number;
  rdc_ohm_m: number;
  method: "iec60228" | "resistivity";
  source: string;
}

/**
 * DC resistance per metre of a round conductor at θ: R_20 from IEC 60228 (the maximum
 * for the class, as IEC 60287-1-1 §2.1.1 takes R_0) where the nominal size is
 * tabulated, otherwise ρ_20·k/A with the stranding allowance k; then
 * R_θ = R_20·(β + θ)/(β + 20) — IEC 60287-1-1:2006 §2.1.1.
 */
export function roundConductorDc(input: RoundDcInput): RoundDcResult {
  const m = material(input.materialId);
  const ratio = (m.beta_K + input.theta_C) / (m.beta_K + 20);
  if (input.nominalMetric) {
    const e = iec60228MaxResistance(input.area_m2 * 1e6, IEC60228_CLASS_OF[input.construction], m.metal);
    if (e) return { r20_ohm_m: e.maxResistance20_ohm_m, rdc_ohm_m: e.maxResistance20_ohm_m * ratio, method: "iec60228", source: e.source };
  }
  const k = STRANDING_ALLOWANCE[input.construction];
  const r20 = (resistivity20(m, input.temperId) * k) / input.area_m2;
  return {
    r20_ohm_m: r20,
    rdc_ohm_m: r20 * ratio,
    method: "resistivity",
    source: k === 1 ? "ρ20/A (materials table)" : `ρ20·${k}/A (stranding allowance ${Math.round((k - 1) * 100)} %, common practice)`,
  };
}

// ---------------------------------------------------------------------------------
// Round conductors — AC, IEC 60287-1-1:2006 §2.1.2–2.1.4
// ---------------------------------------------------------------------------------

/**
 * Skin and proximity factors k_s, k_p — IEC 60287-1-1:2006 Table 2 (copper and
 * aluminium; round solid 1/1, round stranded with extruded insulation 1/1; compacted
 * conductors in impregnated-paper cables 1/0.8 — from memory).
 */
export const SKIN_PROXIMITY_FACTORS: Record<RoundConstruction, { ks: number; kp: number; source: string }> = {
  solid: { ks: 1, kp: 1, source: "IEC 60287-1-1:2006 Table 2, round solid" },
  stranded: { ks: 1, kp: 1, source: "IEC 60287-1-1:2006 Table 2, round stranded (extruded insulation)" },
  compacted: { ks: 1, kp: 0.8, source: "IEC 60287-1-1:2006 Table 2, round compacted/impregnated — from memory" },
  flexible: { ks: 1, kp: 1, source: "IEC 60287-1-1:2006 Table 2, round stranded (taken for flexible) — from memory" },
};

/** Skin-effect factor y_s of IEC 60287-1-1:2006 §2.1.2 from x_s (three ranges). */
export function iecSkinFactor(xs: number): number {
  if (xs <= 2.8) {
    const x4 = xs ** 4;
    return x4 / (192 + 0.8 * x4);
  }
  if (xs <= 3.8) return -0.136 - 0.0177 * xs + 0.0563 * xs * xs;
  return 0.354 * xs - 0.733;
}

/** x² = (8πf/R′)·10⁻⁷·k — IEC 60287-1-1:2006 §2.1.2 (k_s) and §2.1.4 (k_p); R′ in Ω/m at operating temperature. */
export function iecX(frequency_Hz: number, rdc_ohm_m: number, k: number): number {
  return Math.sqrt(((8 * Math.PI * frequency_Hz) / rdc_ohm_m) * 1e-7 * k);
}

export type CableLayout = "three-single-core" | "three-core" | "two-core";
export const CABLE_LAYOUTS = ["three-single-core", "three-core", "two-core"] as const;

/**
 * Proximity-effect factor y_p — IEC 60287-1-1:2006 §2.1.4:
 *   F = x_p⁴/(192 + 0.8·x_p⁴);
 *   two-core (or two single-core) cables: y_p = F·(d_c/s)²·2.9;
 *   three-core or three single-core cables: y_p = F·(d_c/s)²·[0.312·(d_c/s)² + 1.18/(F + 0.27)].
 * Stated for x_p ≤ 2.8.
 */
export function iecProximityFactor(xp: number, dc_m: number, s_m: number, layout: CableLayout): number {
  const x4 = xp ** 4;
  const F = x4 / (192 + 0.8 * x4);
  const r = (dc_m / s_m) ** 2;
  if (layout === "two-core") return F * r * 2.9;
  return F * r * (0.312 * r + 1.18 / (F + 0.27));
}

export interface RoundAcInput {
  materialId: string;
  temperId?: string;
  /** Cross-section, m² (or give diameter_m). */
  area_m2?: number;
  /** Conductor diameter d_c, m; default the equal-area diameter √(4A/π). */
  diameter_m?: number;
  theta_C: number;
  frequency_Hz: number;
  construction: RoundConstruction;
  nominalMetric?: boolean;
  /** Axial spacing s between conductors, m (trefoil, or flat formation: √(s1·s2) per IEC 60287-1-1 §2.1.4). */
  spacing_m?: number;
  layout?: CableLayout;
}

export interface RoundAcResult {
  rdc: number;
  rac: number;
  ys: number;
  yp: number;
  xs: number;
  xp: number;
  ks: number;
  kp: number;
  diameter_m: number;
  /** ω·L per metre for the given spacing, Ω/m (undefined without spacing). */
  reactance?: number;
  dcMethod: RoundDcResult;
  warnings: Warning[];
}

/**
 * AC resistance of a round conductor: R = R′·(1 + y_s + y_p) — IEC 60287-1-1:2006
 * §2.1. Reactance with a spacing: X = ω·(μ0/2π)·[ln(2s/d_c) + 1/4], the per-phase
 * inductance of a symmetrical (trefoil) three-phase group or one conductor of a loop
 * of solid round wires (common practice; GMR = r·e^{−1/4}).
 */
export function roundConductorAc(input: RoundAcInput): RoundAcResult {
  const warnings: Warning[] = [];
  const area = input.area_m2 ?? (input.diameter_m !== undefined ? (Math.PI * input.diameter_m ** 2) / 4 : NaN);
  if (!(area > 0)) throw new RangeError("round conductor: give area_m2 or diameter_m (positive)");
  const dc = input.diameter_m ?? Math.sqrt((4 * area) / Math.PI);
  const dcRes = roundConductorDc({ materialId: input.materialId, temperId: input.temperId, area_m2: area, theta_C: input.theta_C, construction: input.construction, nominalMetric: input.nominalMetric });
  const rdc = dcRes.rdc_ohm_m;
  const { ks, kp } = SKIN_PROXIMITY_FACTORS[input.construction];
  const f = input.frequency_Hz;
  const xs = f > 0 ? iecX(f, rdc, ks) : 0;
  const xp = f > 0 ? iecX(f, rdc, kp) : 0;
  const ys = f > 0 ? iecSkinFactor(xs) : 0;
  let yp = 0;
  let reactance: number | undefined;
  if (input.spacing_m !== undefined && f > 0) {
    if (input.spacing_m < dc) throw new EngineError("spacing-below-diameter", `spacing ${input.spacing_m} m is less than the conductor diameter ${dc.toPrecision(3)} m`, "spacing_m");
    yp = iecProximityFactor(xp, dc, input.spacing_m, input.layout ?? "three-single-core");
    if (xp > 2.8) warnings.push({ code: "proximity-outside-validity", message: `x_p = ${xp.toFixed(2)} exceeds 2.8, the limit of the IEC 60287-1-1 §2.1.4 proximity formula; y_p is an extrapolation` });
    reactance = 2 * Math.PI * f * 2e-7 * (Math.log((2 * input.spacing_m) / dc) + 0.25);
  }
  return { rdc, rac: rdc * (1 + ys + yp), ys, yp, xs, xp, ks, kp, diameter_m: dc, reactance, dcMethod: dcRes, warnings };
}

// ---------------------------------------------------------------------------------
// Top-level calculation: kind "resistance"
// ---------------------------------------------------------------------------------

const AWG_PATTERN = /^(1[0-4]|[1-9]|[1-4]\/0)$/;

const sizeSchema = z.discriminatedUnion("unit", [
  z.object({ unit: z.literal("mm2"), value: num("Conductor size", "mm²", 0.05, 3000) }),
  z.object({
    unit: z.literal("awg"),
    value: z.string().trim().regex(AWG_PATTERN, { message: "Conductor size (AWG) must be one of 14…1, 1/0, 2/0, 3/0, 4/0" }),
  }),
  z.object({ unit: z.literal("kcmil"), value: num("Conductor size", "kcmil", 250, 2000) }),
]);

const roundSchema = z.object({
  type: z.literal("round"),
  construction: choice("Construction", ROUND_CONSTRUCTIONS),
  size: sizeSchema,
  /** Axial spacing between the conductors of a circuit (for proximity effect and reactance). */
  spacing_m: num("Conductor spacing", "m", 0.001, 10).optional(),
  layout: choice("Cable layout", CABLE_LAYOUTS).optional(),
});

const barsSchema = z.object({
  type: z.literal("bars"),
  barWidth_m: num("Bar width", "m", 0.003, 0.5),
  barThickness_m: num("Bar thickness", "m", 0.001, 0.05),
  barsPerPhase: int("Bars per phase", 1, 8),
  gap_m: num("Gap between bars", "m", 0, 0.2),
  phases: z.union([z.literal(1), z.literal(2), z.literal(3)], { error: () => "Phases must be 1, 2 or 3" }),
  phaseSpacing_m: num("Phase spacing", "m", 0, 2),
  orientation: choice("Bar orientation", BAR_ORIENTATIONS),
  filamentsPerBar: int("Filaments per bar", 9, 400).optional(),
});

export const resistanceInputSchema = z
  .object({
    conductor: z.discriminatedUnion("type", [roundSchema, barsSchema], { error: () => 'Conductor type must be "round" or "bars"' }),
    materialId: choice("Material", MATERIAL_IDS),
    temperId: z.string().optional(),
    temperature_C: num("Conductor temperature", "°C", -50, 250),
    frequency_Hz: num("Frequency", "Hz", 0, 1000),
    length_m: num("Length", "m", 0, 100000, { exclusiveMin: true }),
    parallel: int("Sets in parallel", 1, 20),
  })
  .superRefine((v, ctx) => {
    if (v.temperId !== undefined) {
      try {
        temper(material(v.materialId), v.temperId);
      } catch {
        const m = material(v.materialId);
        ctx.addIssue({ code: "custom", path: ["temperId"], message: `Temper must be one of: ${m.tempers.map((t) => t.id).join(", ")}` });
      }
    }
    const c = v.conductor;
    if (c.type === "bars") {
      if (c.barThickness_m > c.barWidth_m) ctx.addIssue({ code: "custom", path: ["conductor", "barThickness_m"], message: "Bar thickness must not exceed the bar width" });
      const pack = c.barsPerPhase * c.barThickness_m + (c.barsPerPhase - 1) * c.gap_m;
      if (c.phases > 1 && c.phaseSpacing_m < pack)
        ctx.addIssue({ code: "custom", path: ["conductor", "phaseSpacing_m"], message: `Phase spacing must be at least the pack thickness, ${(pack * 1000).toFixed(1)} mm` });
      if (c.barsPerPhase > 1 && c.gap_m <= 0) ctx.addIssue({ code: "custom", path: ["conductor", "gap_m"], message: "Gap between bars must be greater than 0 m when there is more than one bar per phase" });
    }
  });

export type ResistanceInput = z.input<typeof resistanceInputSchema>;
export type ResistanceParsed = z.output<typeof resistanceInputSchema>;

export interface ResistanceResults {
  /** Conductor cross-section of one set (one phase), m². */
  area_m2: number;
  /** DC resistance per metre of the whole (sets in parallel), Ω/m. */
  rdc_ohm_m: number;
  rac_ohm_m: number;
  racOverRdc: number;
  /** Reactance per metre where known, Ω/m. */
  reactance_ohm_m?: number;
  rdcTotal_ohm: number;
  racTotal_ohm: number;
  reactanceTotal_ohm?: number;
  method: "iec60228" | "resistivity" | "filament";
  /** For bars: Rac/Rdc of each phase and the share of each bar. */
  bars?: Pick<BarArrangementAcResult, "ratio" | "worstPhase" | "perBar" | "filamentCount" | "reactancePerPhase_ohm_m" | "density">;
}

function sizeToArea(size: ResistanceParsed["conductor"] & { type: "round" }): { area_m2: number; nominalMetric: boolean; label: string } {
  const s = size.size;
  if (s.unit === "mm2") return { area_m2: s.value * 1e-6, nominalMetric: true, label: `${s.value} mm²` };
  if (s.unit === "awg") return { area_m2: awgToArea_m2(s.value), nominalMetric: false, label: `${s.value} AWG` };
  return { area_m2: kcmilToArea_m2(s.value), nominalMetric: false, label: `${s.value} kcmil` };
}

const F_TEMP: Formula = { id: "r-theta", expression: "R_θ = R_20·(β + θ)/(β + 20)", source: "IEC 60287-1-1:2006 §2.1.1" };

/**
 * DC and AC resistance of a conductor run. Throws a ZodError for invalid input (use
 * resistanceInputSchema.safeParse and fieldErrors for messages).
 */
export function calcResistance(raw: unknown): CalcResult<ResistanceResults> {
  const input = resistanceInputSchema.parse(raw);
  const m = material(input.materialId);
  const warnings: Warning[] = [];
  const intermediates: Record<string, Quantity> = {};
  const formulas: Formula[] = [F_TEMP];
  const n = input.parallel;
  const f = input.frequency_Hz;
  const c = input.conductor;
  let results: ResistanceResults;

  if (c.type === "round") {
    const { area_m2, nominalMetric, label } = sizeToArea(c);
    const ac = roundConductorAc({
      materialId: m.id,
      temperId: input.temperId,
      area_m2,
      theta_C: input.temperature_C,
      frequency_Hz: f,
      construction: c.construction,
      nominalMetric,
      spacing_m: c.spacing_m,
      layout: c.layout,
    });
    warnings.push(...ac.warnings);
    if (nominalMetric && ac.dcMethod.method === "resistivity")
      warnings.push({ code: "size-not-in-iec60228", message: `${label} is not tabulated in IEC 60228 for this class and metal; resistance from resistivity with a stranding allowance` });
    intermediates.area = q("Conductor cross-section", area_m2, "m²");
    intermediates.r20 = q("DC resistance at 20 °C", ac.dcMethod.r20_ohm_m, "Ω/m");
    intermediates.rdc = q(`DC resistance at ${input.temperature_C} °C (one conductor)`, ac.rdc, "Ω/m");
    formulas.push({ id: "r20", expression: ac.dcMethod.method === "iec60228" ? "R_20 = IEC 60228 maximum" : "R_20 = ρ_20·k/A", source: ac.dcMethod.source });
    if (f > 0) {
      intermediates.xs = q("x_s", ac.xs, "");
      intermediates.ys = q("Skin-effect factor y_s", ac.ys, "");
      intermediates.yp = q("Proximity-effect factor y_p", ac.yp, "");
      formulas.push(
        { id: "xs", expression: "x_s² = (8πf/R′)·10⁻⁷·k_s", source: "IEC 60287-1-1:2006 §2.1.2; k_s " + SKIN_PROXIMITY_FACTORS[c.construction].source },
        { id: "ys", expression: "y_s = x_s⁴/(192 + 0.8·x_s⁴) (x_s ≤ 2.8; further ranges in the clause)", source: "IEC 60287-1-1:2006 §2.1.2" },
        { id: "rac", expression: "R = R′·(1 + y_s + y_p)", source: "IEC 60287-1-1:2006 §2.1" },
      );
      if (c.spacing_m !== undefined) {
        formulas.push({ id: "yp", expression: "y_p = F·(d_c/s)²·[0.312·(d_c/s)² + 1.18/(F + 0.27)], F = x_p⁴/(192 + 0.8·x_p⁴)", source: "IEC 60287-1-1:2006 §2.1.4" });
        formulas.push({ id: "x", expression: "X = ω·(μ0/2π)·[ln(2s/d_c) + 1/4]", source: "common practice (GMR of a solid round conductor r·e^(−1/4))" });
      } else warnings.push({ code: "no-spacing", message: "No spacing given: proximity effect (y_p) and reactance are not included" });
      if (c.construction !== "solid") warnings.push({ code: "equal-area-diameter", message: "Conductor diameter d_c taken as the equal-area diameter √(4A/π); a stranded conductor is slightly larger" });
    }
    results = {
      area_m2,
      rdc_ohm_m: ac.rdc / n,
      rac_ohm_m: ac.rac / n,
      racOverRdc: ac.rac / ac.rdc,
      reactance_ohm_m: ac.reactance === undefined ? undefined : ac.reactance / n,
      rdcTotal_ohm: (ac.rdc / n) * input.length_m,
      racTotal_ohm: (ac.rac / n) * input.length_m,
      reactanceTotal_ohm: ac.reactance === undefined ? undefined : (ac.reactance / n) * input.length_m,
      method: ac.dcMethod.method,
    };
  } else {
    const arr: BarArrangement = {
      barWidth_m: c.barWidth_m,
      barThickness_m: c.barThickness_m,
      barsPerPhase: c.barsPerPhase,
      gap_m: c.gap_m,
      phases: c.phases,
      phaseSpacing_m: c.phaseSpacing_m,
      orientation: c.orientation,
    };
    const rho = resistivityAt(m, input.temperature_C, input.temperId);
    const area = c.barWidth_m * c.barThickness_m * c.barsPerPhase;
    intermediates.area = q("Cross-section of one phase", area, "m²");
    intermediates.rho = q(`Resistivity at ${input.temperature_C} °C`, rho, "Ω·m");
    formulas.push({ id: "rdc", expression: "R_dc = ρ_θ/(n·w·t)", source: "definition of resistivity; ρ_θ by IEC 60287-1-1:2006 §2.1.1" });
    const ac = barArrangementAc(arr, f, rho, { filamentsPerBar: c.filamentsPerBar });
    const rac = ac.racMax_ohm_m;
    intermediates.rdc = q("DC resistance of one phase", ac.rdcPerPhase_ohm_m, "Ω/m");
    if (f > 0) {
      formulas.push({
        id: "filament",
        expression: "(R + jωL)·I = B·V, Bᵀ·I = I_phase; L_ij = −(μ0/2π)·ln g_ij; R_ac = Σ R_i|I_i|²/|I_phase|²",
        source: "Weeks, Wu, McAllister, Singh, IBM J. Res. Dev. 23(6), 1979; GMD of rectangles, Grover, Inductance Calculations",
      });
      intermediates.filaments = q("Filaments in the model", ac.filamentCount, "");
      if (c.phases > 1) warnings.push({ code: "worst-phase", message: `AC resistance given for the phase with the highest loss (phase ${ac.worstPhase + 1}); balanced phase currents assumed` });
      else warnings.push({ code: "isolated-pack", message: `Single pack with its return far away: reactance taken to a return at ${ac.referenceRadius_m.toFixed(2)} m` });
    }
    if (c.barThickness_m / c.barWidth_m > 0.5 && c.barsPerPhase === 1 && f > 0)
      warnings.push({ code: "square-bar", message: "Bar nearly square: the filament result holds, but bar-shape correlations elsewhere may not" });
    results = {
      area_m2: area,
      rdc_ohm_m: ac.rdcPerPhase_ohm_m / n,
      rac_ohm_m: rac / n,
      racOverRdc: rac / ac.rdcPerPhase_ohm_m,
      reactance_ohm_m: f > 0 ? ac.reactancePerPhase_ohm_m[ac.worstPhase]! / n : undefined,
      rdcTotal_ohm: (ac.rdcPerPhase_ohm_m / n) * input.length_m,
      racTotal_ohm: (rac / n) * input.length_m,
      reactanceTotal_ohm: f > 0 ? (ac.reactancePerPhase_ohm_m[ac.worstPhase]! / n) * input.length_m : undefined,
      method: "filament",
      bars: { ratio: ac.ratio, worstPhase: ac.worstPhase, perBar: ac.perBar, filamentCount: ac.filamentCount, reactancePerPhase_ohm_m: ac.reactancePerPhase_ohm_m, density: ac.density },
    };
  }
  if (n > 1 && f > 0) warnings.push({ code: "parallel-equal-sharing", message: `${n} sets in parallel assumed to share current equally; at AC the sharing depends on their layout` });
  intermediates.rac = q("AC resistance per metre", results.rac_ohm_m, "Ω/m");
  if (f === 0) warnings.push({ code: "dc", message: "Frequency 0 Hz: DC resistance only" });
  return { kind: "resistance", engineVersion: ENGINE_VERSION, results, intermediates, formulas, warnings, checks: [] };
}
