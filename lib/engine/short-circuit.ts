/**
 * Short-circuit withstand of a conductor: peak current, thermal (adiabatic) and
 * mechanical (electromagnetic force, bending stress, support forces) checks.
 */
import limitsTable from "../../reference-tables/insulation-limits.json";
import peakTable from "../../reference-tables/peak-factors.json";
import supportTable from "../../reference-tables/support-factors.json";
import { z } from "zod";
import { check, EngineError, ENGINE_VERSION, q, type CalcResult, type Check, type Formula, type Quantity, type Warning } from "./core/result";
import { choice, fieldErrors, int, num } from "./core/schema";
import { BAR_ORIENTATIONS, packThickness, phaseArea, type BarArrangement } from "./geometry";
import { MATERIAL_IDS, material, resistivity20, temper, type Material } from "./materials";

/* ------------------------------------------------------------------ */
/* Insulation temperature limits                                        */
/* ------------------------------------------------------------------ */

export interface InsulationLimit {
  id: string;
  name: string;
  /** Highest conductor temperature in continuous operation, °C. */
  continuous_C: number;
  /** Highest conductor temperature at the end of a short circuit, °C. */
  shortCircuit_C: number;
  /** Printed k factors (A·√s/mm²) of the source table, for cross-checks only. */
  kCu?: number;
  kAl?: number;
  maxSection_mm2?: number;
  minSection_mm2?: number;
  source: string;
}

export const INSULATION_LIMITS: readonly InsulationLimit[] = limitsTable.limits as InsulationLimit[];
export const INSULATION_IDS = [
  "pvc-le300",
  "pvc-gt300",
  "xlpe-epr",
  "rubber-60",
  "mineral-pvc",
  "mineral-bare",
  "bare-busbar",
  "bare-30-200",
  "bare-30-150",
  "bare-30-500",
  "bare-al-30-300",
] as const;
export type InsulationId = (typeof INSULATION_IDS)[number];

export function insulationLimits(id: string): InsulationLimit {
  const l = INSULATION_LIMITS.find((x) => x.id === id);
  if (!l) throw new Error(`unknown insulation "${id}"; known: ${INSULATION_LIMITS.map((x) => x.id).join(", ")}`);
  return l;
}

/* ------------------------------------------------------------------ */
/* Thermal: adiabatic heating                                           */
/* ------------------------------------------------------------------ */

/**
 * K = √[Q_c·(β + 20)/ρ_20] in A·√s/mm² — the material constant of the adiabatic
 * equation, IEC 60364-5-54:2011 Annex A (A.1) / IEC 60949:1988 §3, with Q_c the
 * volumetric heat capacity and ρ_20 the resistivity at 20 °C.
 */
export function adiabaticMaterialConstant(m: Material, temperId?: string): number {
  const K2_SI = (m.volumetricHeatCapacity_J_m3K * (m.beta_K + 20)) / resistivity20(m, temperId); // A²·s/m⁴
  return Math.sqrt(K2_SI) / 1e6; // A·√s/mm²
}

/**
 * k = K·√ln[(β + θ_f)/(β + θ_i)] in A·√s/mm² — IEC 60364-5-54:2011 Annex A (A.1),
 * IEC 60364-4-43:2008 §434.5.2, IEC 60949:1988 eq. (1) (adiabatic, no heat loss).
 */
export function adiabaticK(materialId: string, thetaInitial_C: number, thetaFinal_C: number, temperId?: string): number {
  const m = material(materialId);
  if (!(thetaFinal_C > thetaInitial_C)) throw new Error(`final temperature (${thetaFinal_C} °C) must exceed the initial temperature (${thetaInitial_C} °C)`);
  if (!(m.beta_K + thetaInitial_C > 0)) throw new Error(`initial temperature ${thetaInitial_C} °C is below −β of ${m.name}`);
  return adiabaticMaterialConstant(m, temperId) * Math.sqrt(Math.log((m.beta_K + thetaFinal_C) / (m.beta_K + thetaInitial_C)));
}

/** S = √(I²·t)/k in mm² — IEC 60364-5-54:2011 §543.1.2, IEC 60364-4-43:2008 §434.5.2. */
export function minimumSectionAdiabatic(I_A: number, t_s: number, k: number): number {
  return (I_A * Math.sqrt(t_s)) / k;
}

/** I = k·S/√t in A — the same equation solved for the current a section withstands for t. */
export function withstandCurrentAdiabatic(S_mm2: number, t_s: number, k: number): number {
  return (k * S_mm2) / Math.sqrt(t_s);
}

/**
 * θ_f = (β + θ_i)·exp[I²t/(K²S²)] − β — IEC 60949:1988 eq. (1) solved for the final
 * temperature (adiabatic).
 */
export function finalTemperatureAdiabatic(m: Material, I_A: number, t_s: number, S_mm2: number, thetaInitial_C: number, temperId?: string): number {
  const K = adiabaticMaterialConstant(m, temperId);
  return (m.beta_K + thetaInitial_C) * Math.exp((I_A * I_A * t_s) / (K * K * S_mm2 * S_mm2)) - m.beta_K;
}

/* ------------------------------------------------------------------ */
/* Peak short-circuit current                                           */
/* ------------------------------------------------------------------ */

export interface PeakFactorRow {
  upTo_kA: number | null;
  powerFactor: number;
  n: number;
}
export const PEAK_FACTOR_ROWS: readonly PeakFactorRow[] = peakTable.rows as PeakFactorRow[];
export const PEAK_FACTOR_SOURCE: string = peakTable.source;

/** Row of IEC 61439-1:2020 Table 7 for an rms current (kA); each row's upper bound is inclusive. */
export function peakFactorRow(I_kA: number): PeakFactorRow {
  const row = PEAK_FACTOR_ROWS.find((r) => r.upTo_kA === null || I_kA <= r.upTo_kA);
  return row ?? PEAK_FACTOR_ROWS[PEAK_FACTOR_ROWS.length - 1]!;
}

/** κ = 1.02 + 0.98·e^(−3R/X) — IEC 60909-0:2016 §8.1 eq. (55) (approximation, R/X up to about 1). */
export function kappaFromRX(rOverX: number): number {
  return 1.02 + 0.98 * Math.exp(-3 * rOverX);
}

/** R/X of an impedance with power factor cos φ: R/X = cos φ/sin φ. */
export function rOverXFromPowerFactor(pf: number): number {
  return pf / Math.sqrt(1 - pf * pf);
}

/**
 * Factor m for the heat effect of the d.c. component:
 * m = [e^(4·f·T_k·ln(κ−1)) − 1]/(2·f·T_k·ln(κ−1)) — IEC 60909-0:2016 §12.2 (thermal
 * equivalent short-circuit current, equation number from memory), IEC 60865-1:2011 Annex.
 */
export function dcHeatFactorM(kappa: number, f_Hz: number, T_s: number): number {
  if (!(kappa > 1)) return 0;
  const L = Math.log(kappa - 1);
  if (L === 0) return 0;
  return (Math.exp(4 * f_Hz * T_s * L) - 1) / (2 * f_Hz * T_s * L);
}

/* ------------------------------------------------------------------ */
/* Mechanical: forces between rectangular conductors                    */
/* ------------------------------------------------------------------ */

/** Magnetic constant μ0 (N/A²). 4π·10⁻⁷ to better than 1·10⁻⁹ relative (CODATA 2018). */
export const MU0 = 4 * Math.PI * 1e-7;

/** Force per metre between two long parallel filaments, N/m: F' = (μ0/2π)·i1·i2/a — IEC 60865-1:2011 §5.2 (Ampère's law). */
export function forcePerMetreFilaments(i1_A: number, i2_A: number, a_m: number): number {
  return ((MU0 / (2 * Math.PI)) * i1_A * i2_A) / a_m;
}

/**
 * Second antiderivative in the force direction of u/(u²+v²), integrated over the
 * relative position v across the width with the triangular weight (b − |v|):
 * closed form of ∫_{−b}^{b}(b − |v|)·H(u,v) dv, H = ½u·ln(u²+v²) − u + v·atan(u/v).
 * Odd in u.
 */
function rectangleKernel(u: number, b: number): number {
  if (u === 0) return 0;
  const sign = Math.sign(u);
  const x = Math.abs(u);
  const L = Math.log(x * x + b * b);
  const lnx2 = Math.log(x * x);
  const at = Math.atan(b / x);
  const A1 = b * L - 2 * b + 2 * x * at; // ∫₀ᵇ ln(x²+v²) dv
  const A2 = 0.5 * ((x * x + b * b) * L - b * b - x * x * lnx2); // ∫₀ᵇ v·ln(x²+v²) dv
  const A3 = (Math.PI * b * b) / 4 - (0.5 * (b * b + x * x) * at - 0.5 * x * b); // ∫₀ᵇ v·atan(x/v) dv
  const A4 = (Math.PI * b ** 3) / 6 - ((b ** 3 / 3) * at - (x * b * b) / 6 + ((x ** 3) / 6) * (L - lnx2)); // ∫₀ᵇ v²·atan(x/v) dv
  return sign * 2 * (0.5 * x * (b * A1 - A2) - (x * b * b) / 2 + (b * A3 - A4));
}

/**
 * Correction factor k for two equal parallel rectangular conductors with uniform
 * current density: the force is k times the force between filaments at the centre
 * distance s. d = dimension in the direction of the force, b = perpendicular to it.
 * Exact integral of Ampère's force over both cross-sections (H. B. Dwight, "Calculation
 * of magnetic force on disconnecting switch blades", AIEE Trans. 1920 — the relation
 * plotted in IEC 60865-1:2011 Figure 1 as k_1s against (a_1s − d)/(d + b) with b/d as
 * parameter — figure axes from memory). Far apart (s > 20·max(b, d)) the series
 * k ≈ 1 + (d² − b²)/(6s²) is used: it avoids cancellation and errs by O((dim/s)⁴).
 */
export function rectangularBarFactor(s_m: number, d_m: number, b_m: number): number {
  if (!(s_m >= d_m)) throw new Error(`centre distance ${s_m} m is less than the bar dimension ${d_m} m in the direction of the force: bars overlap`);
  if (s_m > 20 * Math.max(b_m, d_m)) return 1 + (d_m * d_m - b_m * b_m) / (6 * s_m * s_m);
  const sum = rectangleKernel(s_m + d_m, b_m) - 2 * rectangleKernel(s_m, b_m) + rectangleKernel(s_m - d_m, b_m);
  return (s_m * sum) / (d_m * d_m * b_m * b_m);
}

/**
 * Effective distance between the sub-conductors of a pack of n equal bars,
 * 1/a_s = Σ_{i=2..n} k_1i/a_1i — IEC 60865-1:2011 §5.3 eq. (4) (equation number from memory).
 */
export function subConductorEffectiveDistance(n: number, d_m: number, b_m: number, gap_m: number): number {
  let inv = 0;
  for (let i = 2; i <= n; i++) {
    const a1i = (i - 1) * (d_m + gap_m);
    inv += rectangularBarFactor(a1i, d_m, b_m) / a1i;
  }
  return 1 / inv;
}

/* ------------------------------------------------------------------ */
/* Support arrangements                                                  */
/* ------------------------------------------------------------------ */

export interface SupportType {
  id: string;
  name: string;
  alphaA: number;
  alphaB: number;
  beta: number;
  spans: number;
}
export const SUPPORT_TYPES: readonly SupportType[] = supportTable.supports as SupportType[];
export const SUPPORT_IDS = ["single-simple", "single-fixed-simple", "single-fixed-fixed", "continuous-2", "continuous-3plus"] as const;
export type SupportId = (typeof SUPPORT_IDS)[number];
export function supportType(id: string): SupportType {
  const s = SUPPORT_TYPES.find((x) => x.id === id);
  if (!s) throw new Error(`unknown support type "${id}"; known: ${SUPPORT_TYPES.map((x) => x.id).join(", ")}`);
  return s;
}

/** Plasticity factor q for rectangular sections — IEC 60865-1:2011 §5.4.2 Table 4 (from memory). */
export const Q_RECTANGULAR = 1.5;

/* ------------------------------------------------------------------ */
/* Input schema                                                          */
/* ------------------------------------------------------------------ */

const barArrangementSchema = z.object({
  barWidth_m: num("Bar width", "m", 0, 1, { exclusiveMin: true }),
  barThickness_m: num("Bar thickness", "m", 0, 0.2, { exclusiveMin: true }),
  barsPerPhase: int("Bars per phase", 1, 8),
  gap_m: num("Gap between bars of a phase", "m", 0, 0.5),
  phases: z.union([z.literal(1), z.literal(2), z.literal(3)], { error: () => "Phases must be one of: 1, 2, 3" }),
  phaseSpacing_m: num("Phase spacing (centre to centre)", "m", 0, 5),
  orientation: choice("Bar orientation", BAR_ORIENTATIONS),
});

const peakSchema = z.discriminatedUnion(
  "mode",
  [
    z.object({ mode: z.literal("table") }),
    z.object({ mode: z.literal("rx"), rOverX: num("R/X ratio", "", 0, 10) }),
    z.object({ mode: z.literal("entered"), n: num("Peak factor n = i_p/I", "", 1, 2 * Math.SQRT2) }),
  ],
  { error: () => "Peak factor mode must be one of: table, rx, entered" },
);

const conductorSchema = z.discriminatedUnion(
  "type",
  [
    z.object({ type: z.literal("bars"), arrangement: barArrangementSchema }),
    z.object({ type: z.literal("section"), section_mm2: num("Conductor section", "mm²", 0, 1e6, { exclusiveMin: true }) }),
  ],
  { error: () => "Conductor type must be one of: bars, section" },
);

export const faultWithstandSchema = z.object({
  I_kA: num("Prospective short-circuit current (rms)", "kA", 0, 1000, { exclusiveMin: true }),
  t_s: num("Short-circuit duration", "s", 0, 10, { exclusiveMin: true }),
  frequency_Hz: num("Frequency", "Hz", 10, 400).default(50),
  peak: peakSchema.default({ mode: "table" }),
  /** Include the heat of the d.c. component (factor m); the a.c. component is taken as not decaying (n = 1, far from generator). */
  dcComponent: z.boolean().default(false),
  materialId: choice("Material", MATERIAL_IDS),
  temperId: z.string().optional(),
  conductor: conductorSchema,
  insulationId: choice("Insulation", INSULATION_IDS).default("bare-busbar"),
  /** Conductor temperature when the fault starts; defaults to the insulation's continuous limit. */
  thetaInitial_C: num("Initial conductor temperature", "°C", -40, 400).optional(),
  /** Overrides the insulation's short-circuit temperature limit. */
  thetaFinal_C: num("Final temperature limit", "°C", 0, 1000).optional(),
  span_m: num("Support span", "m", 0, 20, { exclusiveMin: true }).optional(),
  supportId: choice("Support type", SUPPORT_IDS).default("continuous-3plus"),
  /** Distance between spacers of a pack; defaults to the span (no spacers within a span). */
  spacerDistance_m: num("Spacer distance", "m", 0, 20, { exclusiveMin: true }).optional(),
  /** V_σ·V_r; 1 is the upper bound for three-phase faults without three-phase auto-reclosure. */
  vSigmaVr: num("V_σ·V_r", "", 0, 5).default(1),
  /** V_F·V_r; 2.7 is the upper bound for three-phase faults. */
  vFVr: num("V_F·V_r", "", 0, 5).default(2.7),
  /** Rated (cantilever) strength of one support, N. */
  supportRating_N: num("Support rated strength", "N", 0, 1e6, { exclusiveMin: true }).optional(),
});
export type FaultWithstandInput = z.input<typeof faultWithstandSchema>;
export type FaultWithstandParsed = z.output<typeof faultWithstandSchema>;

/* ------------------------------------------------------------------ */
/* Calculation                                                           */
/* ------------------------------------------------------------------ */

export interface MechanicalResults {
  /** Effective distance between main conductors (phase packs), m. */
  effectiveDistance_m: number;
  /** Rectangular-conductor factor k_12 between the phase packs. */
  k12: number;
  /** Force per metre on the main conductor (central conductor for three phases), N/m. */
  forcePerMetre_N_m: number;
  /** Effective distance between sub-conductors (null for one bar per phase), m. */
  subEffectiveDistance_m: number | null;
  /** Force per metre between sub-conductors, N/m. */
  subForcePerMetre_N_m: number;
  sectionModulusMain_m3: number;
  sectionModulusSub_m3: number;
  /** Allowed total stress q·R_p0.2, Pa. */
  allowedStress_Pa: number;
  proofStress_Pa: number;
  /** Longest span meeting the stress limits (and the support rating if entered), m; null when no force limits it. */
  maxSpan_m: number | null;
  /** Results at the entered span; null without a span. */
  atSpan: null | {
    span_m: number;
    spacerDistance_m: number;
    forceOverSpan_N: number;
    mainStress_Pa: number;
    subStress_Pa: number;
    totalStress_Pa: number;
    /** Force on the outer (A) and inner (B) supports, N. */
    supportForceA_N: number;
    supportForceB_N: number;
  };
}

export interface FaultWithstandResults {
  I_A: number;
  peakFactor: number;
  kappa: number;
  ip_A: number;
  /** Thermal equivalent short-circuit current I_th = I·√(m + n), A. */
  Ith_A: number;
  m: number;
  thetaInitial_C: number;
  thetaFinalLimit_C: number;
  /** Adiabatic factor, A·√s/mm² (the trade's unit). */
  k_A_sqrt_s_per_mm2: number;
  section_m2: number;
  minimumSection_m2: number;
  /** Symmetrical rms current the conductor withstands for t without exceeding the final limit, A. */
  withstandCurrent_A: number;
  finalTemperature_C: number;
  mechanical: MechanicalResults | null;
}

export function calcFaultWithstand(raw: FaultWithstandInput): CalcResult<FaultWithstandResults> {
  const parsed = faultWithstandSchema.safeParse(raw);
  if (!parsed.success) {
    const errs = fieldErrors(parsed.error);
    const [field, message] = Object.entries(errs)[0] ?? ["_", "invalid input"];
    throw new EngineError("invalid-input", message, field);
  }
  const inp = parsed.data;
  const warnings: Warning[] = [];
  const formulas: Formula[] = [];
  const checks: Check[] = [];
  const intermediates: Record<string, Quantity> = {};

  const mat = material(inp.materialId);
  let temperId: string | undefined;
  try {
    temperId = temper(mat, inp.temperId).id;
  } catch (e) {
    throw new EngineError("unknown-temper", (e as Error).message, "temperId");
  }
  const tmp = temper(mat, temperId);

  /* Peak current */
  const I = inp.I_kA * 1000;
  let n: number;
  let kappa: number;
  if (inp.peak.mode === "table") {
    const row = peakFactorRow(inp.I_kA);
    n = row.n;
    kappa = n / Math.SQRT2;
    intermediates.powerFactor = q("Power factor (IEC 61439-1 Table 7)", row.powerFactor, "");
    formulas.push({ id: "peak-table", expression: "i_p = n·I, n from the rms current range", source: PEAK_FACTOR_SOURCE });
  } else if (inp.peak.mode === "rx") {
    kappa = kappaFromRX(inp.peak.rOverX);
    n = kappa * Math.SQRT2;
    formulas.push({ id: "kappa", expression: "κ = 1.02 + 0.98·e^(−3R/X); i_p = κ·√2·I″k", source: "IEC 60909-0:2016 §8.1 eq. (55)" });
    if (inp.peak.rOverX > 1) warnings.push({ code: "rx-out-of-range", message: `R/X = ${inp.peak.rOverX} is above 1; IEC 60909-0 eq. (55) is stated for R/X up to about 1 (κ tends to 1.02)` });
  } else {
    n = inp.peak.n;
    kappa = n / Math.SQRT2;
    formulas.push({ id: "peak-entered", expression: "i_p = n·I (n entered)", source: "entered by the user" });
  }
  const ip = n * I;
  intermediates.n = q("Peak factor n = i_p/I", n, "");
  intermediates.kappa = q("Peak factor κ = n/√2", kappa, "");
  intermediates.ip = q("Peak short-circuit current i_p", ip, "A");

  /* Thermal */
  const lim = insulationLimits(inp.insulationId);
  const thetaI = inp.thetaInitial_C ?? lim.continuous_C;
  const thetaF = inp.thetaFinal_C ?? lim.shortCircuit_C;
  if (!(thetaF > thetaI)) throw new EngineError("final-below-initial", `Final temperature limit (${thetaF} °C) must exceed the initial conductor temperature (${thetaI} °C)`, "thetaFinal_C");
  if (thetaI > lim.continuous_C) warnings.push({ code: "initial-above-continuous", message: `Initial temperature ${thetaI} °C is above the continuous limit ${lim.continuous_C} °C of ${lim.name}` });
  if (inp.thetaFinal_C !== undefined && inp.thetaFinal_C > lim.shortCircuit_C)
    warnings.push({ code: "final-above-insulation", message: `Final temperature limit ${inp.thetaFinal_C} °C is above the short-circuit limit ${lim.shortCircuit_C} °C of ${lim.name} (${lim.source})` });

  const S_m2 = inp.conductor.type === "bars" ? phaseArea(inp.conductor.arrangement) : inp.conductor.section_mm2 * 1e-6;
  const S_mm2 = S_m2 * 1e6;
  if (lim.maxSection_mm2 !== undefined && S_mm2 > lim.maxSection_mm2) warnings.push({ code: "section-insulation-mismatch", message: `${lim.name} applies to sections up to ${lim.maxSection_mm2} mm²; the section is ${S_mm2.toFixed(0)} mm² — use pvc-gt300` });
  if (lim.minSection_mm2 !== undefined && S_mm2 <= lim.minSection_mm2) warnings.push({ code: "section-insulation-mismatch", message: `${lim.name} applies to sections above ${lim.minSection_mm2} mm²; the section is ${S_mm2.toFixed(0)} mm² — use pvc-le300` });

  const K = adiabaticMaterialConstant(mat, temperId);
  const k = K * Math.sqrt(Math.log((mat.beta_K + thetaF) / (mat.beta_K + thetaI)));
  const m = inp.dcComponent ? dcHeatFactorM(kappa, inp.frequency_Hz, inp.t_s) : 0;
  const heatFactor = Math.sqrt(m + 1);
  const Ith = I * heatFactor;
  const Smin_mm2 = minimumSectionAdiabatic(Ith, inp.t_s, k);
  const Iw = withstandCurrentAdiabatic(S_mm2, inp.t_s, k) / heatFactor;
  const thetaEnd = finalTemperatureAdiabatic(mat, Ith, inp.t_s, S_mm2, thetaI, temperId);
  intermediates.K = q("Material constant K = √[Q_c(β+20)/ρ20]", K, "A·√s/mm²");
  intermediates.k = q("Adiabatic factor k", k, "A·√s/mm²");
  intermediates.m = q("Heat factor of the d.c. component m", m, "");
  intermediates.Ith = q("Thermal equivalent current I_th", Ith, "A");
  intermediates.section = q("Conductor section S", S_mm2, "mm²");
  intermediates.minimumSection = q("Minimum section S_min", Smin_mm2, "mm²");
  intermediates.withstand = q(`Withstand current for ${inp.t_s} s`, Iw, "A");
  intermediates.finalTemperature = q("Final conductor temperature θ_f", thetaEnd, "°C");
  formulas.push(
    { id: "adiabatic-k", expression: "k = √[Q_c·(β + 20)/ρ_20 · ln((β + θ_f)/(β + θ_i))]", source: "IEC 60364-5-54:2011 Annex A eq. (A.1); IEC 60949:1988 eq. (1)" },
    { id: "adiabatic-section", expression: "S = √(I_th²·t)/k", source: "IEC 60364-4-43:2008 §434.5.2; IEC 60364-5-54:2011 §543.1.2" },
    { id: "adiabatic-withstand", expression: "I = k·S/(√t·√(m + n))", source: "IEC 60364-4-43:2008 §434.5.2 solved for I; IEC 60865-1:2011 §7 (thermal equivalent current)" },
    { id: "adiabatic-final", expression: "θ_f = (β + θ_i)·exp[I_th²·t/(K²·S²)] − β", source: "IEC 60949:1988 eq. (1) solved for θ_f" },
  );
  if (inp.dcComponent)
    formulas.push({ id: "dc-heat", expression: "I_th = I·√(m + n), m = [e^(4fT_k·ln(κ−1)) − 1]/(2fT_k·ln(κ−1)), n = 1", source: "IEC 60909-0:2016 §12.2 (far from generator: n = 1) — equation numbers from memory" });
  if (inp.t_s > 5) warnings.push({ code: "adiabatic-duration", message: `Duration ${inp.t_s} s exceeds 5 s: the adiabatic assumption of IEC 60364-4-43 §434.5.2 holds up to 5 s; the result is conservative but heat loss is no longer negligible` });
  if (inp.t_s < 0.1 && !inp.dcComponent)
    warnings.push({ code: "short-duration-asymmetry", message: `Duration ${inp.t_s} s is below 0.1 s, where asymmetry matters: include the d.c. component or use the protective device's let-through I²t (IEC 60364-4-43 §434.5.2)` });
  checks.push(check("final-temperature", "Final conductor temperature", thetaEnd, thetaF, "°C"));
  checks.push(check("thermal-section", "Conductor section vs adiabatic minimum", S_mm2, Smin_mm2, "mm²", "min"));

  /* Mechanical */
  let mech: MechanicalResults | null = null;
  if (inp.conductor.type === "bars") {
    mech = mechanical(inp.conductor.arrangement, ip, inp, tmp.proofStress_MPa * 1e6, intermediates, formulas, warnings, checks);
  } else if (inp.span_m !== undefined) {
    warnings.push({ code: "no-geometry", message: "A support span was entered without bar geometry: the mechanical check needs a bar arrangement" });
  }

  return {
    kind: "fault-withstand",
    engineVersion: ENGINE_VERSION,
    results: {
      I_A: I,
      peakFactor: n,
      kappa,
      ip_A: ip,
      Ith_A: Ith,
      m,
      thetaInitial_C: thetaI,
      thetaFinalLimit_C: thetaF,
      k_A_sqrt_s_per_mm2: k,
      section_m2: S_m2,
      minimumSection_m2: Smin_mm2 * 1e-6,
      withstandCurrent_A: Iw,
      finalTemperature_C: thetaEnd,
      mechanical: mech,
    },
    intermediates,
    formulas,
    warnings,
    checks,
  };
}

function mechanical(
  a: BarArrangement,
  ip: number,
  inp: FaultWithstandParsed,
  Rp02_Pa: number,
  intermediates: Record<string, Quantity>,
  formulas: Formula[],
  warnings: Warning[],
  checks: Check[],
): MechanicalResults {
  const d = a.barThickness_m; // dimension in the direction of the force (phases stand across the thickness)
  const b = a.barWidth_m;
  const nb = a.barsPerPhase;
  const dm = packThickness(a);
  const sup = supportType(inp.supportId);
  const c = MU0 / (2 * Math.PI);

  let am = Infinity;
  let k12 = 1;
  let Fm = 0;
  if (a.phases > 1) {
    if (!(a.phaseSpacing_m > dm)) throw new EngineError("phases-overlap", `Phase spacing (${a.phaseSpacing_m} m) must exceed the pack thickness (${dm} m)`, "conductor.arrangement.phaseSpacing_m");
    k12 = rectangularBarFactor(a.phaseSpacing_m, dm, b);
    am = a.phaseSpacing_m / k12;
    Fm = a.phases === 3 ? (c * (Math.sqrt(3) / 2) * ip * ip) / am : (c * ip * ip) / am;
    formulas.push(
      { id: "effective-distance", expression: "a_m = a/k_12, k_12 for rectangles d_m × b at centre distance a (exact integral)", source: "IEC 60865-1:2011 §5.2 and Figure 1 (Dwight, AIEE Trans. 1920)" },
      a.phases === 3
        ? { id: "force-main", expression: "F_m3 = (μ0/2π)·(√3/2)·i_p3²·l/a_m (central conductor)", source: "IEC 60865-1:2011 §5.2 eq. (2)" }
        : { id: "force-main", expression: "F_m2 = (μ0/2π)·i_p2²·l/a_m", source: "IEC 60865-1:2011 §5.2 eq. (1)" },
    );
    if (a.phaseSpacing_m < dm + 0.01) warnings.push({ code: "close-phases", message: "Clear distance between phase packs below 10 mm: check creepage and clearance (IEC 61439-1 §8.3)" });
  }
  intermediates.k12 = q("Rectangular-conductor factor k_12", k12, "");
  intermediates.am = q("Effective distance a_m", am, "m");
  intermediates.Fm = q("Force per metre on the main conductor", Fm, "N/m");

  let as: number | null = null;
  let Fs = 0;
  if (nb > 1) {
    if (!(a.gap_m > 0)) throw new EngineError("bars-touch", "Gap between bars of a phase must be greater than 0 for the sub-conductor force", "conductor.arrangement.gap_m");
    as = subConductorEffectiveDistance(nb, d, b, a.gap_m);
    Fs = (c * (ip / nb) * (ip / nb)) / as;
    intermediates.as = q("Effective distance between sub-conductors a_s", as, "m");
    intermediates.Fs = q("Force per metre between sub-conductors", Fs, "N/m");
    formulas.push(
      { id: "sub-distance", expression: "1/a_s = Σ k_1i/a_1i", source: "IEC 60865-1:2011 §5.3 (equation number from memory)" },
      { id: "force-sub", expression: "F_s = (μ0/2π)·(i_p/n)²·l_s/a_s", source: "IEC 60865-1:2011 §5.3" },
    );
  }

  const Zs = (b * d * d) / 6;
  const Zm = nb * Zs;
  const allowed = Q_RECTANGULAR * Rp02_Pa;
  intermediates.Zm = q("Section modulus of the main conductor Z = n·b·d²/6", Zm, "m³");
  intermediates.allowed = q("Allowed stress q·R_p0.2", allowed / 1e6, "MPa");
  formulas.push(
    { id: "stress-main", expression: "σ_m = V_σ·V_r·β·F_m·l/(8·Z), Z = n·b·d²/6 (no stiffening elements)", source: "IEC 60865-1:2011 §5.4.2 eq. (6); Z of packs without stiffening elements per IEC 60865-1 Table (from memory)" },
    { id: "stress-limit", expression: "σ_tot = σ_m + σ_s ≤ q·R_p0.2 (q = 1.5 rectangular); σ_s ≤ R_p0.2", source: "IEC 60865-1:2011 §5.4.2–§5.4.3 (q from memory)" },
    { id: "support-force", expression: "F_d = V_F·V_r·α·F_m", source: "IEC 60865-1:2011 §5.4.4 (α from Table 3, from memory)" },
    { id: "v-factors", expression: `V_σ·V_r = ${inp.vSigmaVr}, V_F·V_r = ${inp.vFVr}`, source: "Simplified method: upper bounds of IEC 60865-1:2011 Table 2 without three-phase auto-reclosure (V_σ·V_r = 1, V_F·V_r = 2.7 three-phase) — from memory; natural frequency not evaluated" },
  );
  if (nb > 1) formulas.push({ id: "stress-sub", expression: "σ_s = V_σ·V_r·F_s·l_s/(16·Z_s), Z_s = b·d²/6", source: "IEC 60865-1:2011 §5.4.2 eq. (7)" });

  // Stresses per span²: σ_m = cm·l², σ_s = cs·l_s².
  const cm = (inp.vSigmaVr * sup.beta * Fm) / (8 * Zm);
  const cs = nb > 1 ? (inp.vSigmaVr * Fs) / (16 * Zs) : 0;
  const alphaMax = Math.max(sup.alphaA, sup.alphaB);
  let maxSpan: number;
  if (inp.spacerDistance_m !== undefined) {
    const sigmaS = cs * inp.spacerDistance_m ** 2;
    maxSpan = sigmaS > Rp02_Pa || sigmaS >= allowed ? 0 : cm > 0 ? Math.sqrt((allowed - sigmaS) / cm) : Infinity;
  } else {
    maxSpan = cm + cs > 0 ? Math.sqrt(allowed / (cm + cs)) : Infinity;
    if (cs > 0) maxSpan = Math.min(maxSpan, Math.sqrt(Rp02_Pa / cs));
  }
  if (inp.supportRating_N !== undefined && Fm > 0) maxSpan = Math.min(maxSpan, inp.supportRating_N / (inp.vFVr * alphaMax * Fm));
  if (Number.isFinite(maxSpan)) intermediates.maxSpan = q("Longest span meeting the limits", maxSpan, "m");

  let atSpan: MechanicalResults["atSpan"] = null;
  if (inp.span_m !== undefined) {
    const l = inp.span_m;
    const ls = inp.spacerDistance_m ?? l;
    if (ls > l) warnings.push({ code: "spacer-beyond-span", message: `Spacer distance ${ls} m exceeds the span ${l} m` });
    const sm = cm * l * l;
    const ss = cs * ls * ls;
    const st = sm + ss;
    const FA = inp.vFVr * sup.alphaA * Fm * l;
    const FB = inp.vFVr * sup.alphaB * Fm * l;
    atSpan = { span_m: l, spacerDistance_m: ls, forceOverSpan_N: Fm * l, mainStress_Pa: sm, subStress_Pa: ss, totalStress_Pa: st, supportForceA_N: FA, supportForceB_N: FB };
    intermediates.sigmaM = q("Main-conductor bending stress σ_m", sm / 1e6, "MPa");
    intermediates.sigmaS = q("Sub-conductor bending stress σ_s", ss / 1e6, "MPa");
    intermediates.supportForce = q("Force on the most loaded support F_d", Math.max(FA, FB), "N");
    checks.push(check("bending-total", "Total bending stress σ_tot vs q·R_p0.2", st, allowed, "Pa"));
    if (nb > 1) checks.push(check("bending-sub", "Sub-conductor stress σ_s vs R_p0.2", ss, Rp02_Pa, "Pa"));
    if (inp.supportRating_N !== undefined) checks.push(check("support-force", "Force on supports vs rated strength", Math.max(FA, FB), inp.supportRating_N, "N"));
    if (a.phases > 1 && l < 10 * a.phaseSpacing_m)
      warnings.push({ code: "short-span", message: `Span ${l} m is less than 10 × the phase spacing: the long-conductor force formula overestimates the force (common practice)` });
  }
  if (a.phases === 1 && nb === 1) warnings.push({ code: "no-force", message: "A single bar with one phase carries no electromagnetic force from other conductors in this model" });

  return {
    effectiveDistance_m: am,
    k12,
    forcePerMetre_N_m: Fm,
    subEffectiveDistance_m: as,
    subForcePerMetre_N_m: Fs,
    sectionModulusMain_m3: Zm,
    sectionModulusSub_m3: Zs,
    allowedStress_Pa: allowed,
    proofStress_Pa: Rp02_Pa,
    maxSpan_m: Number.isFinite(maxSpan) ? maxSpan : null,
    atSpan,
  };
}
