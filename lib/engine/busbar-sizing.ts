/**
 * Busbar sizing: enumerate standard flat-bar arrangements (stock sizes × 1…4 bars per
 * phase, gap = bar thickness), smallest section first, and keep those that meet the
 * temperature limit at the required current, and optionally a voltage-drop limit and a
 * short-time (fault) withstand.
 *
 * Speed: every candidate is first screened at DC (R_ac ≥ R_dc, so a bar too hot at DC is
 * too hot at AC) — a few tens of µs. Only survivors get R_ac/R_dc from the filament
 * method, computed at the resistivity of the temperature limit (so the pass/fail
 * boundary itself is exact) with a coarser mesh of 20 filaments per bar (R_ac/R_dc
 * within ~1.5 % of the 60-filament default for 1–4 bars of 40–200 mm), after a cheaper
 * 8-filament screen that rejects the clear failures; both are cached per geometry,
 * frequency and resistivity (module-level, across calls, so a live form that changes
 * the current or the limits re-uses them). The search stops after `maxResults` passes.
 */
import { z } from "zod";
import flatBars from "../../reference-tables/flat-bars.json";
import { acRatios, barCurrentForTemperature, barTemperatureForCurrent, dcResistanceAt, heatLossPerMetre, prepareBusbar, withAcRatio, type PreparedBusbar } from "./busbar-thermal";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Check, type Formula, type Warning } from "./core/result";
import { choice, int, num } from "./core/schema";
import { BAR_ORIENTATIONS, packThickness, type BarArrangement } from "./geometry";
import { emissivity as finishEmissivity, material, MATERIAL_IDS, resistivity20, SURFACE_FINISHES, type SurfaceFinish } from "./materials";
import { adiabaticK, minimumSectionAdiabatic } from "./short-circuit";

interface FlatBarSize {
  name: string;
  width_mm: number;
  thickness_mm: number;
}

const SERIES = ["metric", "inch"] as const;
export type BarSeries = (typeof SERIES)[number];

export function flatBarSizes(series: BarSeries): FlatBarSize[] {
  const t = flatBars as unknown as Record<BarSeries, FlatBarSize[]>;
  return t[series];
}

/** Filaments per bar used by sizing (see the module comment for the accuracy). */
export const SIZING_FILAMENTS_PER_BAR = 20;
/** Filaments per bar of the AC screen (the ratio converges from below as the mesh is refined). */
export const SCREEN_FILAMENTS_PER_BAR = 8;

/* ------------------------------------------------------------------ */
/* R_ac/R_dc cache                                                      */
/* ------------------------------------------------------------------ */

const acCache = new Map<string, { ratio: number[]; reactance_ohm_m: number[] }>();
const AC_CACHE_MAX = 2000;
let filamentSolves = 0;

function cachedAc(arr: BarArrangement, f: number, rho: number, filamentsPerBar: number): { ratio: number[]; reactance_ohm_m: number[] } {
  const key = [arr.barWidth_m, arr.barThickness_m, arr.barsPerPhase, arr.gap_m, arr.phases, arr.phaseSpacing_m, arr.orientation, f, rho.toPrecision(6), filamentsPerBar].join("|");
  const hit = acCache.get(key);
  if (hit) return hit;
  if (f > 0) filamentSolves++;
  const v = acRatios(arr, f, rho, filamentsPerBar);
  if (acCache.size >= AC_CACHE_MAX) acCache.delete(acCache.keys().next().value!);
  acCache.set(key, v);
  return v;
}

/** Empties the R_ac/R_dc cache (benchmarks). */
export function clearSizingCache(): void {
  acCache.clear();
}

/* ------------------------------------------------------------------ */
/* Input                                                                */
/* ------------------------------------------------------------------ */

export const busbarSizingSchema = z
  .object({
    current_A: num("Required current", "A", 1, 50000),
    frequency_Hz: num("Frequency", "Hz", 0, 1000).default(50),
    materialIds: z.array(choice("Material", MATERIAL_IDS)).min(1, { message: "Materials: choose at least one" }).default(["cu-etp"]),
    finish: choice("Surface finish", SURFACE_FINISHES).default("oxidised"),
    emissivity: num("Emissivity", "", 0.01, 1).optional(),
    ambient_C: num("Ambient (enclosure air) temperature", "°C", -40, 100),
    altitude_m: num("Altitude", "m", 0, 5000).default(0),
    orientation: choice("Orientation", BAR_ORIENTATIONS).default("edge"),
    phases: int("Phases", 1, 3).default(3),
    phaseClearance_m: num("Clearance between phase packs", "m", 0.005, 1).default(0.05),
    series: choice("Bar size series", SERIES).default("metric"),
    maxBarsPerPhase: int("Most bars per phase", 1, 4).default(4),
    maxTemperature_C: num("Maximum bar temperature", "°C", -39, 400),
    voltageDrop: z
      .object({
        length_m: num("Busbar length", "m", 0.01, 10000),
        systemVoltage_V: num("System voltage", "V", 1, 100000),
        maxPercent: num("Voltage drop limit", "%", 0.01, 50),
        powerFactor: num("Power factor", "", 0, 1).default(0.9),
      })
      .optional(),
    fault: z
      .object({
        current_A: num("Short-time withstand current Icw", "A", 1, 1e6),
        duration_s: num("Short-time duration", "s", 0.01, 10),
        initialTemperature_C: num("Temperature at the start of the fault", "°C", -40, 400).optional(),
        finalTemperature_C: num("Temperature at the end of the fault", "°C", 0, 1000),
      })
      .optional(),
    maxResults: int("Number of results", 1, 50).default(10),
    maxFailures: int("Number of failing results", 0, 20).default(5),
  })
  .superRefine((v, ctx) => {
    if (v.maxTemperature_C <= v.ambient_C) ctx.addIssue({ code: "custom", path: ["maxTemperature_C"], message: `Maximum bar temperature must be above the ambient temperature (${v.ambient_C} °C)` });
    if (v.fault) {
      const ti = v.fault.initialTemperature_C ?? v.maxTemperature_C;
      if (v.fault.finalTemperature_C <= ti) ctx.addIssue({ code: "custom", path: ["fault", "finalTemperature_C"], message: `Temperature at the end of the fault must be above the start temperature (${ti} °C)` });
    }
  });

export type BusbarSizingInput = z.input<typeof busbarSizingSchema>;

export interface SizingCandidate {
  materialId: string;
  size: string;
  barsPerPhase: number;
  arrangement: BarArrangement;
  /** Section of one phase, mm². */
  area_mm2: number;
  /** Hottest phase at the required current, °C (a lower bound — at DC, or with the coarse AC screen — when rejected before the full AC solve). */
  temperature_C: number;
  /** Current at the temperature limit, hottest phase, A (undefined when screened out at DC). */
  ratedCurrent_A?: number;
  /** Heat given off by the hottest phase at the required current, W/m. */
  loss_W_m: number;
  acRatio: number;
  /** (limit − θ) in K; negative = too hot. */
  temperatureMargin_K: number;
  /** Rating/current − 1; negative = overloaded. */
  currentMargin?: number;
  voltageDrop_percent?: number;
  faultMinSection_mm2?: number;
  pass: boolean;
  /** Why it fails (empty when it passes). */
  reasons: string[];
}

export interface BusbarSizingResults {
  passing: SizingCandidate[];
  /** The last failing arrangements met by the search (the largest that fail, closest to passing), largest first. */
  failing: SizingCandidate[];
  /** Arrangements evaluated. */
  evaluated: number;
  /** Filament solves actually run (the rest came from the cache or the DC screen). */
  filamentSolves: number;
}

/* ------------------------------------------------------------------ */
/* Calculation                                                          */
/* ------------------------------------------------------------------ */

export function calcBusbarSizing(input: BusbarSizingInput): CalcResult<BusbarSizingResults> {
  const v = busbarSizingSchema.parse(input);
  const solvesBefore = filamentSolves;
  const phases = v.phases as 1 | 2 | 3;
  const warnings: Warning[] = [];

  type Cand = { materialId: string; size: FlatBarSize; n: number; arr: BarArrangement; area_m2: number; order: number };
  const cands: Cand[] = [];
  v.materialIds.forEach((materialId, mi) => {
    for (const size of flatBarSizes(v.series as BarSeries)) {
      for (let n = 1; n <= v.maxBarsPerPhase; n++) {
        const w = size.width_mm / 1000;
        const t = size.thickness_mm / 1000;
        const base: BarArrangement = { barWidth_m: w, barThickness_m: t, barsPerPhase: n, gap_m: t, phases, phaseSpacing_m: 0, orientation: v.orientation };
        const arr = { ...base, phaseSpacing_m: phases > 1 ? packThickness(base) + v.phaseClearance_m : 0 };
        cands.push({ materialId, size, n, arr, area_m2: w * t * n, order: mi });
      }
    }
  });
  cands.sort((a, b) => a.area_m2 - b.area_m2 || a.n - b.n || a.order - b.order);

  const passing: SizingCandidate[] = [];
  const failing: SizingCandidate[] = [];
  let evaluated = 0;
  const I = v.current_A;
  const limit = v.maxTemperature_C;
  const cosPhi = v.frequency_Hz > 0 ? (v.voltageDrop?.powerFactor ?? 1) : 1;
  const sinPhi = Math.sqrt(Math.max(0, 1 - cosPhi * cosPhi));
  // IEC 60364-5-52:2009 Annex G: u = b·(R·cos φ + X·sin φ)·L·I, b = 1 three-phase (relative to U0 = U/√3), 2 otherwise.
  const vdFactor = phases === 3 ? 1 : 2;
  const vdU0 = v.voltageDrop ? (phases === 3 ? v.voltageDrop.systemVoltage_V / Math.sqrt(3) : v.voltageDrop.systemVoltage_V) : 1;

  for (const c of cands) {
    if (passing.length >= v.maxResults) break;
    evaluated++;
    const m = material(c.materialId);
    const eps = v.emissivity ?? finishEmissivity(m.metal, v.finish as SurfaceFinish);
    const reasons: string[] = [];
    const area_mm2 = c.area_m2 * 1e6;

    let faultMin: number | undefined;
    if (v.fault) {
      const k = adiabaticK(c.materialId, v.fault.initialTemperature_C ?? limit, v.fault.finalTemperature_C);
      faultMin = minimumSectionAdiabatic(v.fault.current_A, v.fault.duration_s, k);
      if (area_mm2 < faultMin) reasons.push(`section ${area_mm2.toFixed(0)} mm² is below the ${faultMin.toFixed(0)} mm² needed for ${v.fault.current_A} A for ${v.fault.duration_s} s`);
    }

    const preps: PreparedBusbar[] = Array.from({ length: phases }, (_, i) =>
      prepareBusbar({ arrangement: c.arr, materialId: c.materialId, emissivity: eps, ambient_C: v.ambient_C, phaseIndex: i, altitude_m: v.altitude_m }),
    );
    const hottestOf = (ps: PreparedBusbar[]) => {
      let best = { i: 0, theta: -Infinity };
      ps.forEach((p, i) => {
        const th = barTemperatureForCurrentSafe(p, I);
        if (th > best.theta) best = { i, theta: th };
      });
      return best;
    };

    // DC screen: temperature and (R only, lower bound) voltage drop; a fault failure also stops here.
    const dc = hottestOf(preps);
    if (dc.theta > limit) reasons.push(dc.theta === Infinity ? "no heat balance (current far too high)" : `${dc.theta.toFixed(1)} °C even at DC, above the ${limit} °C limit`);
    if (v.voltageDrop && Number.isFinite(dc.theta)) {
      const lowerBound = (100 * vdFactor * dcResistanceAt(preps[dc.i]!, dc.theta) * cosPhi * v.voltageDrop.length_m * I) / vdU0;
      if (lowerBound > v.voltageDrop.maxPercent) reasons.push(`voltage drop above ${lowerBound.toFixed(2)} % even at DC, over the ${v.voltageDrop.maxPercent} % limit`);
    }
    if (reasons.length > 0) {
      const p = preps[dc.i]!;
      pushFailing(failing, v.maxFailures, {
        materialId: c.materialId, size: c.size.name, barsPerPhase: c.n, arrangement: c.arr, area_mm2,
        temperature_C: dc.theta, loss_W_m: Number.isFinite(dc.theta) ? heatLossPerMetre(p, dc.theta).total_W_m : Infinity, acRatio: 1,
        temperatureMargin_K: limit - dc.theta, faultMinSection_mm2: faultMin, pass: false, reasons,
      });
      continue;
    }

    // AC.
    const rhoLimit = (resistivity20(m) * (m.beta_K + limit)) / (m.beta_K + 20);
    if (v.frequency_Hz > 0) {
      // Coarse AC screen: with 8 filaments per bar the ratio comes out low (refining the mesh
      // raises it in every convergence run made for this module), so a coarse fail is a fail.
      const coarse = cachedAc(c.arr, v.frequency_Hz, rhoLimit, SCREEN_FILAMENTS_PER_BAR);
      const cp = preps.map((p, i) => withAcRatio(p, coarse.ratio[i]!));
      const ch = hottestOf(cp);
      if (ch.theta > limit) {
        reasons.push(ch.theta === Infinity ? "no heat balance (current far too high)" : `${ch.theta.toFixed(1)} °C at ${I} A (coarse AC screen), above the ${limit} °C limit`);
        pushFailing(failing, v.maxFailures, {
          materialId: c.materialId, size: c.size.name, barsPerPhase: c.n, arrangement: c.arr, area_mm2,
          temperature_C: ch.theta, loss_W_m: Number.isFinite(ch.theta) ? heatLossPerMetre(cp[ch.i]!, ch.theta).total_W_m : Infinity, acRatio: cp[ch.i]!.acRatio,
          temperatureMargin_K: limit - ch.theta, faultMinSection_mm2: faultMin, pass: false, reasons,
        });
        continue;
      }
    }
    const ac = cachedAc(c.arr, v.frequency_Hz, rhoLimit, SIZING_FILAMENTS_PER_BAR);
    const acPreps = preps.map((p, i) => withAcRatio(p, ac.ratio[i]!));
    const hot = hottestOf(acPreps);
    const hp = acPreps[hot.i]!;
    const rated = Math.min(...acPreps.map((p) => barCurrentForTemperature(p, limit)));
    if (hot.theta > limit) reasons.push(`${hot.theta.toFixed(1)} °C at ${I} A, above the ${limit} °C limit`);

    let vdPercent: number | undefined;
    if (v.voltageDrop && Number.isFinite(hot.theta)) {
      const R = dcResistanceAt(hp, hot.theta) * hp.acRatio;
      const X = phases > 1 ? Math.abs(ac.reactance_ohm_m[hot.i] ?? 0) : 0;
      vdPercent = (100 * vdFactor * (R * cosPhi + X * sinPhi) * v.voltageDrop.length_m * I) / vdU0;
      if (vdPercent > v.voltageDrop.maxPercent) reasons.push(`voltage drop ${vdPercent.toFixed(2)} % above the ${v.voltageDrop.maxPercent} % limit`);
    }

    const cand: SizingCandidate = {
      materialId: c.materialId, size: c.size.name, barsPerPhase: c.n, arrangement: c.arr, area_mm2,
      temperature_C: hot.theta, ratedCurrent_A: rated,
      loss_W_m: Number.isFinite(hot.theta) ? heatLossPerMetre(hp, hot.theta).total_W_m : Infinity,
      acRatio: hp.acRatio, temperatureMargin_K: limit - hot.theta, currentMargin: rated / I - 1,
      voltageDrop_percent: vdPercent, faultMinSection_mm2: faultMin, pass: reasons.length === 0, reasons,
    };
    if (cand.pass) passing.push(cand);
    else pushFailing(failing, v.maxFailures, cand);
  }

  if (v.voltageDrop && phases === 1) warnings.push({ code: "vd-resistance-only", message: "single isolated pack: voltage drop from resistance only (the reactance depends on the return path, not given)" });
  if (passing.length === 0) warnings.push({ code: "no-arrangement-passes", message: `no arrangement of up to ${v.maxBarsPerPhase} bars per phase in the ${v.series} series meets all limits` });
  if (v.orientation === "flat" && v.maxBarsPerPhase > 1) warnings.push({ code: "flat-pack-gaps", message: "bars lying flat in a pack: each gap is counted as one downward-facing plate (stated simplification)" });

  const best = passing[0];
  const checks: Check[] = [];
  if (best) {
    checks.push(check("temperature", `Bar temperature, ${best.barsPerPhase} × ${best.size} ${best.materialId}`, best.temperature_C, limit, "°C", "max"));
    if (best.voltageDrop_percent !== undefined && v.voltageDrop) checks.push(check("voltage-drop", "Voltage drop", best.voltageDrop_percent, v.voltageDrop.maxPercent, "%", "max"));
    if (best.faultMinSection_mm2 !== undefined) checks.push(check("fault-section", "Section against the adiabatic minimum", best.area_mm2, best.faultMinSection_mm2, "mm²", "min"));
  }

  const formulas: Formula[] = [
    { id: "balance", expression: "I²·R_ac(θ) = q_conv(θ) + q_rad(θ) per phase; R_ac/R_dc at ρ(θ_max)", source: "busbar heat balance (see busbar rating); filament method for R_ac/R_dc" },
    { id: "screen", expression: "θ_DC ≤ θ_AC, so θ_DC > θ_max rejects without the AC solve", source: "R_ac ≥ R_dc (common practice)" },
  ];
  if (v.voltageDrop) formulas.push({ id: "vd", expression: "ΔU% = 100·b·(R·cos φ + X·sin φ)·L·I/U0, b = 1 (three-phase, U0 = U/√3) or 2", source: "IEC 60364-5-52:2009 Annex G" });
  if (v.fault) formulas.push({ id: "fault", expression: "S_min = I·√t/k, k = K·√ln[(β + θ_f)/(β + θ_i)]", source: "IEC 60364-5-54:2011 Annex A; IEC 60949:1988 eq. (1)" });

  const n = filamentSolves - solvesBefore;
  return {
    kind: "busbar-sizing",
    engineVersion: ENGINE_VERSION,
    results: { passing, failing: failing.slice().reverse(), evaluated, filamentSolves: n },
    intermediates: {
      evaluated: q("Arrangements evaluated", evaluated, ""),
      filamentSolves: q("Filament solves run", n, ""),
      candidates: q("Arrangements in the series", cands.length, ""),
    },
    formulas,
    warnings,
    checks,
  };
}

function barTemperatureForCurrentSafe(p: PreparedBusbar, I: number): number {
  try {
    return barTemperatureForCurrent(p, I);
  } catch (e) {
    if (e instanceof EngineError && e.code === "thermal-runaway") return Infinity;
    throw e;
  }
}

/** Keeps the last `max` failing candidates (the largest, met last in ascending order). */
function pushFailing(list: SizingCandidate[], max: number, c: SizingCandidate): void {
  if (max <= 0) return;
  list.push(c);
  if (list.length > max) list.shift();
}
