/**
 * Steady-state heat balance of a busbar phase pack in still air, per metre of length:
 *   I²·R_ac(θ) = q_conv(θ) + q_rad(θ)
 * with R_ac(θ) = (R_ac/R_dc)·ρ_θ/A. Convection from the natural-convection correlations
 * (convection.ts) face by face; radiation from the pack's outer envelope to
 * surroundings at the ambient (enclosure internal air) temperature.
 *
 * Choice on the AC ratio: R_ac/R_dc from the filament method depends on temperature
 * only through ρ and varies slowly with it, while one filament solve costs up to
 * ~100 ms and a temperature solve must take ≤ 50 µs. So the ratio is computed once per
 * arrangement and frequency at the resistivity of an estimated temperature (the
 * temperature limit when one is given), and the heat balance is solved with
 * R(θ) = R_dc(θ)·ratio; `calcBusbarRating` applies one outer correction (ratio
 * recomputed at the solved temperature) when the estimate was more than 5 K off.
 */
import { z } from "zod";
import { airProperties, filmTemperatureK, pressureAtAltitude, G_STANDARD, AIR_TABLE_MIN_K, AIR_TABLE_MAX_K, AIR_TABLE_SOURCE, P_SEA_LEVEL } from "./air";
import { churchillChuPsi, nuPlateDown, nuPlateUp, nuVerticalChannel, nuVerticalPlateWithPsi, rangeWarning, type Correlation } from "./convection";
import { check, EngineError, q, ENGINE_VERSION, type CalcResult, type Check, type Formula, type Quantity, type Warning } from "./core/result";
import { brent } from "./core/roots";
import { choice, int, num } from "./core/schema";
import { barArrangementAc } from "./filament";
import { BAR_ORIENTATIONS, packThickness, type BarArrangement } from "./geometry";
import { emissivity as finishEmissivity, material, MATERIAL_IDS, resistivity20, SURFACE_FINISHES, temper, type SurfaceFinish } from "./materials";

/** Stefan–Boltzmann constant, W/(m²·K⁴) — CODATA 2018 (exact in the 2019 SI). */
export const STEFAN_BOLTZMANN = 5.670374419e-8;
const ZERO_C = 273.15;

/* ------------------------------------------------------------------ */
/* Prepared arrangement                                                 */
/* ------------------------------------------------------------------ */

type SurfaceKind = "vertical" | "up" | "down" | "channel";

export interface ConvectiveSurface {
  label: string;
  kind: SurfaceKind;
  /** Characteristic length: plate or channel height; A/P for horizontal plates, m. */
  L_m: number;
  /** Heated area per metre of pack (all identical faces together), m²/m. */
  area_m2_per_m: number;
  /** Channel spacing (kind "channel"), m. */
  S_m: number;
}

export interface PreparedBusbar {
  arrangement: BarArrangement;
  /** Which phase pack of the row (0-based); decides which faces look at a neighbour. */
  phaseIndex: number;
  ambient_C: number;
  emissivity: number;
  /** Cross-section of the phase, m². */
  area_m2: number;
  rho20_ohm_m: number;
  beta_K: number;
  /** R_ac/R_dc used in the balance (1 for DC). */
  acRatio: number;
  pressure_Pa: number;
  g: number;
  surfaces: ConvectiveSurface[];
  /** Envelope perimeter that radiates, with the view factor to neighbouring packs removed, m. */
  radiatingPerimeter_m: number;
  /** Full outer envelope perimeter, m. */
  envelopePerimeter_m: number;
}

export interface PrepareOptions {
  arrangement: BarArrangement;
  materialId: string;
  temperId?: string;
  emissivity: number;
  ambient_C: number;
  acRatio?: number;
  phaseIndex?: number;
  altitude_m?: number;
}

/**
 * View factor between two parallel strips of equal width w facing each other at clear
 * distance c (Hottel's crossed strings): F = √(1 + (c/w)²) − c/w — Incropera 6th ed.
 * Table 13.1 (parallel plates with midlines connected by a perpendicular).
 */
export function viewFactorParallelStrips(w_m: number, c_m: number): number {
  const r = c_m / w_m;
  return Math.sqrt(1 + r * r) - r;
}

/**
 * The faces of one phase pack and how each is cooled.
 *
 * On edge (faces vertical, height = bar width w): outer faces are vertical plates
 * (Churchill & Chu) or, when they face a neighbouring phase, a vertical channel
 * (Bar-Cohen & Rohsenow) capped at the isolated-plate value; the gaps inside the pack
 * are vertical channels of spacing = gap; the top and bottom edges of each bar are
 * horizontal plates facing up and down with L = A/P = t/2.
 *
 * Flat (faces horizontal): the top face is a plate facing up, the bottom face a plate
 * facing down (L = w/2); each gap inside the pack is counted as one downward-facing
 * plate of width w — a stated simplification (no published correlation for a thin
 * horizontal slot heated on both sides and open at its long edges; the upper face of
 * the lower bar is taken as not cooled); the vertical edges are vertical plates L = t.
 *
 * Radiation leaves the outer envelope only (inner faces see each other); faces that
 * look at a neighbouring phase, which runs at about the same temperature, lose the
 * part F that they exchange with it.
 */
export function prepareBusbar(o: PrepareOptions): PreparedBusbar {
  const a = o.arrangement;
  const m = material(o.materialId);
  const w = a.barWidth_m;
  const t = a.barThickness_m;
  const n = a.barsPerPhase;
  const Tp = packThickness(a);
  const p = o.phaseIndex ?? 0;
  const clear = a.phaseSpacing_m - Tp;
  const neighbourLow = a.phases > 1 && p > 0 && clear > 0;
  const neighbourHigh = a.phases > 1 && p < a.phases - 1 && clear > 0;
  const F = neighbourLow || neighbourHigh ? viewFactorParallelStrips(w, clear) : 0;
  const surfaces: ConvectiveSurface[] = [];
  let rad = 2 * Tp;
  if (a.orientation === "edge") {
    for (const [side, nb] of [["left", neighbourLow], ["right", neighbourHigh]] as const) {
      if (nb) surfaces.push({ label: `${side} outer face (facing the next phase)`, kind: "channel", L_m: w, area_m2_per_m: w, S_m: clear });
      else surfaces.push({ label: `${side} outer face`, kind: "vertical", L_m: w, area_m2_per_m: w, S_m: 0 });
      rad += w * (nb ? 1 - F : 1);
    }
    if (n > 1 && a.gap_m > 0) surfaces.push({ label: "faces inside the pack (gaps)", kind: "channel", L_m: w, area_m2_per_m: 2 * w * (n - 1), S_m: a.gap_m });
    surfaces.push({ label: "top edges", kind: "up", L_m: t / 2, area_m2_per_m: n * t, S_m: 0 });
    surfaces.push({ label: "bottom edges", kind: "down", L_m: t / 2, area_m2_per_m: n * t, S_m: 0 });
  } else {
    surfaces.push({ label: neighbourHigh ? "top face (below the next phase)" : "top face", kind: "up", L_m: w / 2, area_m2_per_m: w, S_m: 0 });
    surfaces.push({ label: neighbourLow ? "bottom face (above the next phase)" : "bottom face", kind: "down", L_m: w / 2, area_m2_per_m: w, S_m: 0 });
    rad += w * (neighbourHigh ? 1 - F : 1) + w * (neighbourLow ? 1 - F : 1);
    if (n > 1 && a.gap_m > 0) surfaces.push({ label: "gaps inside the pack (one face each)", kind: "down", L_m: w / 2, area_m2_per_m: w * (n - 1), S_m: 0 });
    surfaces.push({ label: "side edges", kind: "vertical", L_m: t, area_m2_per_m: 2 * n * t, S_m: 0 });
  }
  return {
    arrangement: a,
    phaseIndex: p,
    ambient_C: o.ambient_C,
    emissivity: o.emissivity,
    area_m2: w * t * n,
    rho20_ohm_m: resistivity20(m, o.temperId),
    beta_K: m.beta_K,
    acRatio: o.acRatio ?? 1,
    pressure_Pa: o.altitude_m ? pressureAtAltitude(o.altitude_m) : P_SEA_LEVEL,
    g: G_STANDARD,
    surfaces,
    radiatingPerimeter_m: rad,
    envelopePerimeter_m: 2 * (w + Tp),
  };
}

/** A copy with another AC ratio (the geometry work is kept). */
export function withAcRatio(p: PreparedBusbar, acRatio: number): PreparedBusbar {
  return { ...p, acRatio };
}

/* ------------------------------------------------------------------ */
/* Heat balance                                                         */
/* ------------------------------------------------------------------ */

/** R_ac(θ) per metre of the phase: ratio·ρ_20·(β + θ)/((β + 20)·A) — IEC 60287-1-1:2006 §2.1.1. */
export function acResistanceAt(p: PreparedBusbar, theta_C: number): number {
  return (p.acRatio * p.rho20_ohm_m * (p.beta_K + theta_C)) / ((p.beta_K + 20) * p.area_m2);
}

export function dcResistanceAt(p: PreparedBusbar, theta_C: number): number {
  return (p.rho20_ohm_m * (p.beta_K + theta_C)) / ((p.beta_K + 20) * p.area_m2);
}

/**
 * h of one surface, W/(m²·K). `gb` = g·β·ΔT/(ν·α), so that Ra_L = gb·L³ (Incropera eq. 9.25);
 * `psi` the Churchill–Chu Prandtl factor. Allocation-free: it runs ~10 times per solve step.
 */
function surfaceH(s: ConvectiveSurface, gb: number, k: number, psi: number): number {
  const L = s.L_m;
  const RaL = gb * L * L * L;
  if (s.kind === "vertical") return (nuVerticalPlateWithPsi(RaL, psi) * k) / L;
  if (s.kind === "up") return (nuPlateUp(RaL) * k) / L;
  if (s.kind === "down") return (nuPlateDown(RaL) * k) / L;
  const S = s.S_m;
  const hCh = (nuVerticalChannel(gb * S * S * S, S, L) * k) / S;
  const hIso = (nuVerticalPlateWithPsi(RaL, psi) * k) / L;
  return hCh < hIso ? hCh : hIso;
}

/** The Ra a surface's correlation is evaluated at (Ra_S for channels). */
function surfaceRa(s: ConvectiveSurface, gb: number): number {
  const L = s.kind === "channel" ? s.S_m : s.L_m;
  return gb * L * L * L;
}

/** Convective loss per metre, W/m (hot loop: no allocation beyond the air record). */
function convectionLoss(p: PreparedBusbar, theta_C: number): number {
  const dT = theta_C - p.ambient_C;
  if (!(dT > 0)) return 0;
  const air = airProperties(filmTemperatureK(theta_C, p.ambient_C), p.pressure_Pa);
  const gb = (p.g * air.beta * dT) / (air.nu * air.alpha);
  const psi = churchillChuPsi(air.Pr);
  let qc = 0;
  for (const s of p.surfaces) qc += surfaceH(s, gb, air.k, psi) * s.area_m2_per_m;
  return qc * dT;
}

/** q_rad = ε·σ·P_rad·(T⁴ − T_a⁴), W/m — Incropera 6th ed. eq. 1.7 (small body in large surroundings). */
function radiationLoss(p: PreparedBusbar, theta_C: number): number {
  const T = theta_C + ZERO_C;
  const Ta = p.ambient_C + ZERO_C;
  return p.emissivity * STEFAN_BOLTZMANN * p.radiatingPerimeter_m * (T * T * T * T - Ta * Ta * Ta * Ta);
}

export interface SurfaceLoss {
  label: string;
  correlation: Correlation;
  Ra: number;
  h_W_m2K: number;
  loss_W_m: number;
}

export interface HeatLoss {
  convection_W_m: number;
  radiation_W_m: number;
  total_W_m: number;
  surfaces: SurfaceLoss[];
  filmTemperature_K: number;
}

/** Heat given off per metre at surface temperature θ, with the split by surface. */
export function heatLossPerMetre(p: PreparedBusbar, theta_C: number): HeatLoss {
  const dT = theta_C - p.ambient_C;
  const Tf = filmTemperatureK(theta_C, p.ambient_C);
  const air = airProperties(Tf, p.pressure_Pa);
  const gb = dT > 0 ? (p.g * air.beta * dT) / (air.nu * air.alpha) : 0;
  const psi = churchillChuPsi(air.Pr);
  const surfaces: SurfaceLoss[] = p.surfaces.map((s) => {
    const h = dT > 0 ? surfaceH(s, gb, air.k, psi) : 0;
    const Ra = surfaceRa(s, gb);
    const correlation: Correlation = s.kind === "channel" ? "vertical-channel" : s.kind === "vertical" ? "vertical-plate" : s.kind === "up" ? "plate-up" : "plate-down";
    return { label: s.label, correlation, Ra, h_W_m2K: h, loss_W_m: h * s.area_m2_per_m * Math.max(dT, 0) };
  });
  const conv = surfaces.reduce((acc, s) => acc + s.loss_W_m, 0);
  const rad = radiationLoss(p, theta_C);
  return { convection_W_m: conv, radiation_W_m: rad, total_W_m: conv + rad, surfaces, filmTemperature_K: Tf };
}

/** Heat balance residual q(θ) − I²·R_ac(θ), W/m; zero at the steady temperature. */
export function balanceResidual(p: PreparedBusbar, current_A: number, theta_C: number): number {
  return convectionLoss(p, theta_C) + radiationLoss(p, theta_C) - current_A * current_A * acResistanceAt(p, theta_C);
}

/** Highest surface temperature the solver will look at, °C (far above any busbar limit). */
const THETA_CEILING_C = 2000;

/**
 * Steady temperature (°C) of the phase at current I (A rms), by Brent's method on the
 * heat balance, bracketed between ambient and an upper bound found by doubling the rise.
 * Throws EngineError "thermal-runaway" when no balance exists below 2000 °C.
 */
export function barTemperatureForCurrent(p: PreparedBusbar, current_A: number): number {
  const Ta = p.ambient_C;
  if (!(current_A > 0)) return Ta;
  const f = (th: number) => balanceResidual(p, current_A, th);
  // First guess of the rise from h ≈ 10 W/(m²·K) over the envelope (common practice order of magnitude).
  let rise = Math.max(0.5, (current_A * current_A * acResistanceAt(p, Ta)) / (10 * p.envelopePerimeter_m));
  let lo = Ta;
  let hi = Math.min(Ta + rise, THETA_CEILING_C);
  if (!(hi > Ta)) throw new EngineError("ambient-too-high", `ambient ${Ta} °C is above the solver ceiling of ${THETA_CEILING_C} °C`, "ambient_C");
  while (!(f(hi) >= 0)) {
    lo = hi;
    if (hi >= THETA_CEILING_C) throw new EngineError("thermal-runaway", `no heat balance below ${THETA_CEILING_C} °C at ${current_A} A: the current is far too high for this arrangement`, "current_A");
    rise *= 2;
    hi = Math.min(Ta + rise, THETA_CEILING_C);
  }
  return brent(f, lo, hi, { xtol: 1e-6 });
}

/** Current (A rms) that holds the phase at θ: I = √(q(θ)/R_ac(θ)) — explicit, no iteration needed. */
export function barCurrentForTemperature(p: PreparedBusbar, theta_C: number): number {
  if (!(theta_C > p.ambient_C)) return 0;
  return Math.sqrt((convectionLoss(p, theta_C) + radiationLoss(p, theta_C)) / acResistanceAt(p, theta_C));
}

/** Temperature against current for plotting. */
export function temperatureCurve(p: PreparedBusbar, currents_A: readonly number[]): { current_A: number; temperature_C: number }[] {
  return currents_A.map((I) => ({ current_A: I, temperature_C: barTemperatureForCurrent(p, I) }));
}

/** Warnings for the correlations and the air table at surface temperature θ. */
/** Below this share of the heat, an out-of-range surface is reported in one summary warning. */
const MINOR_SURFACE_SHARE = 0.1;

export function heatBalanceWarnings(p: PreparedBusbar, theta_C: number): Warning[] {
  const out: Warning[] = [];
  const loss = heatLossPerMetre(p, theta_C);
  // Surfaces outside their correlation's range: named one by one when they matter; the
  // narrow edges of a bar (a few per cent of the heat) are reported together, with their share.
  const minor: { label: string; share: number }[] = [];
  for (const s of loss.surfaces) {
    if (s.correlation === "vertical-channel") continue;
    const w = rangeWarning(s.correlation, s.Ra, s.label);
    if (!w) continue;
    const share = loss.total_W_m > 0 ? s.loss_W_m / loss.total_W_m : 0;
    if (share < MINOR_SURFACE_SHARE) minor.push({ label: s.label, share });
    else out.push(w);
  }
  if (minor.length > 0) {
    const total = minor.reduce((a, m) => a + m.share, 0);
    out.push({
      code: "convection-minor-surfaces-extrapolated",
      message: `${minor.map((m) => m.label).join(" and ")}: too small for the range of the horizontal-plate correlations (Incropera 6th ed. eqs. 9.30–9.32), which are extrapolated there; together they shed ${(100 * total).toFixed(1)} % of the heat`,
    });
  }
  if (loss.filmTemperature_K < AIR_TABLE_MIN_K || loss.filmTemperature_K > AIR_TABLE_MAX_K)
    out.push({ code: "air-table-extrapolated", message: `film temperature ${loss.filmTemperature_K.toFixed(0)} K is outside the air property table (${AIR_TABLE_MIN_K}–${AIR_TABLE_MAX_K} K); properties are extrapolated` });
  return out;
}

/* ------------------------------------------------------------------ */
/* AC ratio                                                             */
/* ------------------------------------------------------------------ */

/** R_ac/R_dc of every phase (filament method, balanced currents); all 1 at DC. */
export function acRatios(arr: BarArrangement, frequency_Hz: number, resistivity_ohm_m: number, filamentsPerBar?: number): { ratio: number[]; reactance_ohm_m: number[] } {
  if (!(frequency_Hz > 0)) return { ratio: Array.from({ length: arr.phases }, () => 1), reactance_ohm_m: Array.from({ length: arr.phases }, () => 0) };
  const r = barArrangementAc(arr, frequency_Hz, resistivity_ohm_m, filamentsPerBar ? { filamentsPerBar } : {});
  return { ratio: r.ratio, reactance_ohm_m: r.reactancePerPhase_ohm_m };
}

/* ------------------------------------------------------------------ */
/* Calculation: busbar rating                                           */
/* ------------------------------------------------------------------ */

export const arrangementSchema = z
  .object({
    barWidth_m: num("Bar width", "m", 0.003, 0.4),
    barThickness_m: num("Bar thickness", "m", 0.001, 0.05),
    barsPerPhase: int("Bars per phase", 1, 8),
    gap_m: num("Gap between bars", "m", 0, 0.2),
    phases: int("Phases", 1, 3) as unknown as z.ZodType<1 | 2 | 3, unknown>,
    phaseSpacing_m: num("Phase spacing", "m", 0, 2),
    orientation: choice("Orientation", BAR_ORIENTATIONS),
  })
  .superRefine((a, ctx) => {
    if (a.barThickness_m > a.barWidth_m) ctx.addIssue({ code: "custom", path: ["barThickness_m"], message: "Bar thickness must not exceed the bar width (width is the larger dimension)" });
    if (a.phases > 1 && a.phaseSpacing_m <= packThickness(a as BarArrangement))
      ctx.addIssue({ code: "custom", path: ["phaseSpacing_m"], message: `Phase spacing must exceed the pack thickness (${(packThickness(a as BarArrangement) * 1000).toFixed(1)} mm) when there is more than one phase` });
  });

export const busbarRatingSchema = z
  .object({
    arrangement: arrangementSchema,
    materialId: choice("Material", MATERIAL_IDS),
    temperId: z.string().optional(),
    finish: choice("Surface finish", SURFACE_FINISHES).default("oxidised"),
    emissivity: num("Emissivity", "", 0.01, 1).optional(),
    ambient_C: num("Ambient (enclosure air) temperature", "°C", -40, 100),
    altitude_m: num("Altitude", "m", 0, 5000).default(0),
    frequency_Hz: num("Frequency", "Hz", 0, 1000).default(50),
    current_A: num("Current", "A", 0, 100000).optional(),
    maxTemperature_C: num("Maximum bar temperature", "°C", -39, 400).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.current_A === undefined && v.maxTemperature_C === undefined)
      ctx.addIssue({ code: "custom", path: ["current_A"], message: "Give a current, a maximum bar temperature, or both" });
    if (v.maxTemperature_C !== undefined && v.maxTemperature_C <= v.ambient_C)
      ctx.addIssue({ code: "custom", path: ["maxTemperature_C"], message: `Maximum bar temperature must be above the ambient temperature (${v.ambient_C} °C)` });
    if (v.temperId) {
      const m = material(v.materialId);
      if (!m.tempers.some((t) => t.id === v.temperId)) ctx.addIssue({ code: "custom", path: ["temperId"], message: `Temper must be one of: ${m.tempers.map((t) => t.id).join(", ")}` });
    }
  });

export type BusbarRatingInput = z.input<typeof busbarRatingSchema>;

export interface PhaseThermal {
  phase: number;
  acRatio: number;
  /** Steady temperature at the given current, °C. */
  temperature_C?: number;
  /** Current at the temperature limit, A. */
  ratedCurrent_A?: number;
}

export interface BusbarRatingResults {
  /** Steady temperature of the hottest phase at the given current, °C. */
  temperature_C?: number;
  /** Current at which the hottest phase reaches the limit, A. */
  ratedCurrent_A?: number;
  /** Phase that decides (hottest / lowest rating). */
  governingPhase: number;
  /** Heat given off per metre by the governing phase at the operating point (given current, else the limit), W/m. */
  loss_W_m: number;
  convection_W_m: number;
  radiation_W_m: number;
  /** Temperature of the operating point the losses and resistances refer to, °C. */
  operatingTemperature_C: number;
  rdc_ohm_m: number;
  rac_ohm_m: number;
  acRatio: number;
  emissivity: number;
  perPhase: PhaseThermal[];
  surfaces: SurfaceLoss[];
  /** Temperature against current (0 … 1.5 × the larger of current and rating) for the governing phase. */
  curve: { current_A: number; temperature_C: number }[];
}

/** Busbar rating: temperature at a current and/or current at a temperature limit. */
export function calcBusbarRating(input: BusbarRatingInput): CalcResult<BusbarRatingResults> {
  const v = busbarRatingSchema.parse(input);
  const arr = v.arrangement as BarArrangement;
  const m = material(v.materialId);
  if (v.temperId) temper(m, v.temperId);
  const eps = v.emissivity ?? finishEmissivity(m.metal, v.finish as SurfaceFinish);
  const warnings: Warning[] = [];
  const formulas: Formula[] = [];
  const checks: Check[] = [];

  const base = Array.from({ length: arr.phases }, (_, i) =>
    prepareBusbar({ arrangement: arr, materialId: v.materialId, temperId: v.temperId, emissivity: eps, ambient_C: v.ambient_C, phaseIndex: i, altitude_m: v.altitude_m }),
  );
  const rhoAt = (th: number) => (resistivity20(m, v.temperId) * (m.beta_K + th)) / (m.beta_K + 20);
  const thetaRef = v.maxTemperature_C ?? v.ambient_C + 50;
  const acRef = acRatios(arr, v.frequency_Hz, rhoAt(thetaRef));
  let reactance = acRef.reactance_ohm_m;
  const perPhase: PhaseThermal[] = base.map((_, i) => ({ phase: i, acRatio: acRef.ratio[i]! }));

  // Rating at the limit: the ratio at ρ(θ_limit) is exact there.
  if (v.maxTemperature_C !== undefined) {
    for (const ph of perPhase) ph.ratedCurrent_A = barCurrentForTemperature(withAcRatio(base[ph.phase]!, ph.acRatio), v.maxTemperature_C);
  }
  let acRatioAtCurrent = acRef.ratio;
  if (v.current_A !== undefined) {
    const solveAll = (ratios: number[]) => perPhase.map((ph) => barTemperatureForCurrent(withAcRatio(base[ph.phase]!, ratios[ph.phase]!), v.current_A!));
    let temps = solveAll(acRef.ratio);
    const hottest = Math.max(...temps);
    if (v.frequency_Hz > 0 && Math.abs(hottest - thetaRef) > 5) {
      // One outer correction: the ratio at the resistivity of the solved temperature.
      const acCorr = acRatios(arr, v.frequency_Hz, rhoAt(hottest));
      acRatioAtCurrent = acCorr.ratio;
      reactance = acCorr.reactance_ohm_m;
      temps = solveAll(acCorr.ratio);
    }
    temps.forEach((t, i) => (perPhase[i]!.temperature_C = t));
  }

  let governing = 0;
  for (const ph of perPhase) {
    const g = perPhase[governing]!;
    if (v.current_A !== undefined ? ph.temperature_C! > g.temperature_C! : ph.ratedCurrent_A! < g.ratedCurrent_A!) governing = ph.phase;
  }
  const gp = perPhase[governing]!;
  const ratio = v.current_A !== undefined ? acRatioAtCurrent[governing]! : gp.acRatio;
  const prep = withAcRatio(base[governing]!, ratio);
  const opTheta = v.current_A !== undefined ? gp.temperature_C! : v.maxTemperature_C!;
  const loss = heatLossPerMetre(prep, opTheta);
  warnings.push(...heatBalanceWarnings(prep, opTheta));
  if (v.maxTemperature_C !== undefined && v.current_A !== undefined) {
    // Also the limit point, when it differs (correlations may leave their range there).
    for (const w of heatBalanceWarnings(withAcRatio(base[governing]!, gp.acRatio), v.maxTemperature_C)) if (!warnings.some((x) => x.code === w.code && (x.message === w.message || w.code === "convection-minor-surfaces-extrapolated"))) warnings.push(w);
  }
  if (v.emissivity !== undefined) warnings.push({ code: "emissivity-override", message: `emissivity set to ${v.emissivity} instead of the ${v.finish} value ${finishEmissivity(m.metal, v.finish as SurfaceFinish)}` });
  if (arr.orientation === "flat" && arr.barsPerPhase > 1)
    warnings.push({ code: "flat-pack-gaps", message: "bars lying flat in a pack: each gap is counted as one downward-facing plate (stated simplification); an on-edge layout cools better" });

  const ratedMin = v.maxTemperature_C !== undefined ? Math.min(...perPhase.map((x) => x.ratedCurrent_A!)) : undefined;
  const rdc = dcResistanceAt(prep, opTheta);
  const rac = rdc * ratio;
  const Imax = Math.max(v.current_A ?? 0, ratedMin ?? 0);
  const curve: { current_A: number; temperature_C: number }[] = [];
  for (let i = 0; i <= 15 && Imax > 0; i++) {
    const I = (1.5 * Imax * i) / 15;
    try {
      curve.push({ current_A: I, temperature_C: barTemperatureForCurrent(prep, I) });
    } catch (e) {
      if (e instanceof EngineError && e.code === "thermal-runaway") break;
      throw e;
    }
  }

  if (v.current_A !== undefined && v.maxTemperature_C !== undefined) {
    checks.push(check("temperature", "Bar temperature at the given current", gp.temperature_C!, v.maxTemperature_C, "°C", "max"));
    checks.push(check("current", "Current against the rating at the temperature limit", v.current_A, ratedMin!, "A", "max"));
  }

  formulas.push(
    { id: "balance", expression: "I²·R_ac(θ) = q_conv(θ) + q_rad(θ)   (per metre of one phase)", source: "steady-state energy balance, Incropera 6th ed. §1.3.1" },
    { id: "resistance", expression: "R_ac(θ) = (R_ac/R_dc)·ρ_20·(β + θ)/((β + 20)·A)", source: "IEC 60287-1-1:2006 §2.1.1; R_ac/R_dc by the filament method (Weeks et al., IBM J. Res. Dev. 23(6), 1979)" },
    { id: "vertical", expression: "Nu_L = {0.825 + 0.387·Ra_L^(1/6)/[1 + (0.492/Pr)^(9/16)]^(8/27)}²", source: "Churchill & Chu, Int. J. Heat Mass Transfer 18 (1975) 1323; Incropera 6th ed. eq. 9.26" },
    { id: "plate-up", expression: "Nu_L = 0.54·Ra_L^(1/4) (10⁴–10⁷), 0.15·Ra_L^(1/3) (10⁷–10¹¹), L = A/P", source: "Incropera 6th ed. eqs. 9.30–9.31" },
    { id: "plate-down", expression: "Nu_L = 0.27·Ra_L^(1/4) (10⁵–10¹⁰), L = A/P", source: "Incropera 6th ed. eq. 9.32" },
    { id: "channel", expression: "Nu_S = [576/(Ra_S·S/L)² + 2.87/(Ra_S·S/L)^(1/2)]^(−1/2), capped at the isolated vertical plate", source: "Bar-Cohen & Rohsenow, J. Heat Transfer 106 (1984) 116; Incropera 6th ed. eq. 9.45, Table 9.3" },
    { id: "radiation", expression: "q_rad = ε·σ·P_rad·(T⁴ − T_a⁴), P_rad = outer envelope less the view factor F = √(1 + (c/w)²) − c/w to a neighbouring phase", source: "Incropera 6th ed. eq. 1.7 and Table 13.1; σ = 5.670374419·10⁻⁸ W/(m²·K⁴), CODATA 2018" },
    { id: "air", expression: "k, ν, α, Pr at T_f = (θ + θ_a)/2; β = 1/T_f; ν, α ∝ 1/p", source: `${AIR_TABLE_SOURCE}; pressure from ISO 2533:1975` },
  );

  const intermediates: Record<string, Quantity> = {
    area: q("Phase cross-section", prep.area_m2, "m²"),
    emissivity: q("Emissivity", eps, ""),
    radiatingPerimeter: q("Radiating perimeter", prep.radiatingPerimeter_m, "m"),
    envelopePerimeter: q("Envelope perimeter", prep.envelopePerimeter_m, "m"),
    filmTemperature: q("Film temperature", loss.filmTemperature_K, "K"),
    pressure: q("Air pressure", prep.pressure_Pa, "Pa"),
    rho: q("Resistivity at the operating temperature", rhoAt(opTheta), "Ω·m"),
    acRatio: q("R_ac/R_dc", ratio, ""),
    rdc: q("R_dc at the operating temperature", rdc, "Ω/m"),
    rac: q("R_ac at the operating temperature", rac, "Ω/m"),
    convection: q("Convection", loss.convection_W_m, "W/m"),
    radiation: q("Radiation", loss.radiation_W_m, "W/m"),
  };
  loss.surfaces.forEach((s, i) => (intermediates[`h_${i}`] = q(`h, ${s.label}`, s.h_W_m2K, "W/(m²·K)")));
  if (v.frequency_Hz > 0) intermediates.reactance = q("Reactance of the governing phase", reactance[governing] ?? 0, "Ω/m");

  return {
    kind: "busbar-rating",
    engineVersion: ENGINE_VERSION,
    results: {
      temperature_C: gp.temperature_C,
      ratedCurrent_A: ratedMin,
      governingPhase: governing,
      loss_W_m: loss.total_W_m,
      convection_W_m: loss.convection_W_m,
      radiation_W_m: loss.radiation_W_m,
      operatingTemperature_C: opTheta,
      rdc_ohm_m: rdc,
      rac_ohm_m: rac,
      acRatio: ratio,
      emissivity: eps,
      perPhase,
      surfaces: loss.surfaces,
      curve,
    },
    intermediates,
    formulas,
    warnings,
    checks,
  };
}
