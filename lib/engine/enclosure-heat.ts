/**
 * Heat budget of an enclosed assembly: total power loss, effective cooling surface,
 * internal air temperature rise and the cooling power needed for a target internal
 * temperature. Requirement: IEC 61439-1:2020 §10.10 (temperature-rise limits);
 * verification method followed: IEC TR 60890:2014 (calculation by extrapolation from
 * the effective cooling surface), simplified to a single overall heat-transfer
 * coefficient as described below.
 */
import { z } from "zod";
import { check, EngineError, ENGINE_VERSION, q, type CalcResult, type Check, type Formula, type Quantity, type Warning } from "./core/result";
import { choice, fieldErrors, num } from "./core/schema";

/* ------------------------------------------------------------------ */
/* Surface factors and installation                                      */
/* ------------------------------------------------------------------ */

/**
 * Surface factor b by surface condition — IEC TR 60890 Table III (from memory):
 * top exposed 1.4, top covered (built-in) 0.7, front/rear/side exposed 0.9,
 * covered (against a wall or a neighbouring section) 0.5, floor not counted.
 */
export const SURFACE_FACTORS = {
  topExposed: 1.4,
  topCovered: 0.7,
  sideExposed: 0.9,
  sideCovered: 0.5,
  floor: 0,
} as const;
export const SURFACE_FACTOR_SOURCE = "IEC TR 60890:2014 Table III surface factor b (from memory)";

export const INSTALLATIONS = ["free-standing", "wall", "row-end", "row-end-wall", "row-centre", "row-centre-wall", "built-in"] as const;
export type Installation = (typeof INSTALLATIONS)[number];

interface Exposure {
  top: boolean;
  rear: boolean;
  left: boolean;
  right: boolean;
}
const EXPOSURE: Record<Installation, Exposure> = {
  "free-standing": { top: true, rear: true, left: true, right: true },
  wall: { top: true, rear: false, left: true, right: true },
  "row-end": { top: true, rear: true, left: false, right: true },
  "row-end-wall": { top: true, rear: false, left: false, right: true },
  "row-centre": { top: true, rear: true, left: false, right: false },
  "row-centre-wall": { top: true, rear: false, left: false, right: false },
  "built-in": { top: false, rear: false, left: false, right: false },
};

export interface CoolingSurface {
  surface: "top" | "front" | "rear" | "left" | "right" | "floor";
  area_m2: number;
  factor: number;
  effective_m2: number;
}

/** A_e = Σ A_0·b over the enclosure's surfaces — IEC TR 60890 §5 (clause number from memory). */
export function coolingSurfaces(width_m: number, height_m: number, depth_m: number, installation: Installation): CoolingSurface[] {
  const e = EXPOSURE[installation];
  const side = (exposed: boolean) => (exposed ? SURFACE_FACTORS.sideExposed : SURFACE_FACTORS.sideCovered);
  const rows: [CoolingSurface["surface"], number, number][] = [
    ["top", width_m * depth_m, e.top ? SURFACE_FACTORS.topExposed : SURFACE_FACTORS.topCovered],
    // The front (door side) is always exposed except for a built-in enclosure, whose front is the only exposed face.
    ["front", width_m * height_m, SURFACE_FACTORS.sideExposed],
    ["rear", width_m * height_m, side(e.rear)],
    ["left", depth_m * height_m, side(e.left)],
    ["right", depth_m * height_m, side(e.right)],
    ["floor", width_m * depth_m, SURFACE_FACTORS.floor],
  ];
  return rows.map(([surface, area_m2, factor]) => ({ surface, area_m2, factor, effective_m2: area_m2 * factor }));
}

export function effectiveCoolingSurface(width_m: number, height_m: number, depth_m: number, installation: Installation): number {
  return coolingSurfaces(width_m, height_m, depth_m, installation).reduce((s, r) => s + r.effective_m2, 0);
}

/* ------------------------------------------------------------------ */
/* Air                                                                   */
/* ------------------------------------------------------------------ */

/** Specific heat of dry air at constant pressure near 300 K, J/(kg·K) — Incropera, 6th ed., Table A.4. */
export const AIR_CP_J_kgK = 1007;
/** Specific gas constant of dry air, J/(kg·K) — ISO 2533:1975 (standard atmosphere). */
export const AIR_R_J_kgK = 287.05287;

/** ρ·c_p of air at θ and pressure p (ideal gas), J/(m³·K). */
export function airVolumetricHeatCapacity(theta_C: number, p_Pa = 101325): number {
  return (p_Pa / (AIR_R_J_kgK * (theta_C + 273.15))) * AIR_CP_J_kgK;
}

/* ------------------------------------------------------------------ */
/* Input schema                                                          */
/* ------------------------------------------------------------------ */

const lossRowSchema = z.object({
  name: z.string().min(1, "Loss row name is required").max(200, "Loss row name must be at most 200 characters"),
  /** Power loss of one item at its rated current, W. */
  loss_W: num("Power loss", "W", 0, 1e6),
  quantity: num("Quantity", "", 0, 10000).default(1),
  /** I_B/I_n; the loss scales with its square (resistive losses). Defaults to 1. */
  loadFactor: num("Load factor I_B/I_n", "", 0, 2).default(1),
  /** Tag of the sheet the row came from (busbar, cable…); absent for devices entered here. */
  sourceSheet: z.string().max(100, "Source sheet tag must be at most 100 characters").optional(),
});

export const enclosureHeatSchema = z.object({
  width_m: num("Enclosure width", "m", 0.05, 50),
  height_m: num("Enclosure height", "m", 0.05, 5),
  depth_m: num("Enclosure depth", "m", 0.05, 5),
  installation: choice("Installation", INSTALLATIONS).default("free-standing"),
  /** Overall heat-transfer coefficient of the enclosure wall, W/(m²·K); 5.5 for painted sheet steel is common practice. */
  heatTransfer_W_m2K: num("Heat-transfer coefficient", "W/(m²·K)", 0.5, 50).default(5.5),
  ambient_C: num("Ambient air temperature", "°C", -40, 70).default(35),
  /** Highest allowed internal air temperature (e.g. the devices' rated ambient). */
  targetInternal_C: num("Target internal air temperature", "°C", -40, 120).default(40),
  /** Ratio of the air temperature rise at the top to the average rise (IEC TR 60890 factor c); omit for average only. */
  topFactor: num("Top-of-enclosure temperature factor", "", 1, 3).optional(),
  /** Rated current of the assembly, A — checks the scope of IEC 61439-1 §10.10.4.3. */
  ratedCurrent_A: num("Rated current of the assembly", "A", 0, 100000).optional(),
  losses: z.array(lossRowSchema).max(2000, "At most 2000 loss rows").default([]),
});
export type EnclosureHeatInput = z.input<typeof enclosureHeatSchema>;

/* ------------------------------------------------------------------ */
/* Calculation                                                           */
/* ------------------------------------------------------------------ */

export interface LossLine {
  name: string;
  sourceSheet: string | null;
  loss_W: number;
}

export interface EnclosureHeatResults {
  totalLoss_W: number;
  /** Loss per source sheet ("devices" for rows entered here). */
  lossBySource_W: Record<string, number>;
  lines: LossLine[];
  surfaces: CoolingSurface[];
  effectiveSurface_m2: number;
  /** Average internal air temperature rise, K. */
  deltaT_K: number;
  internalAverage_C: number;
  /** Air temperature at the top of the enclosure; null without a top factor. */
  internalTop_C: number | null;
  /** Loss the enclosure surface dissipates at the target internal temperature, W. */
  naturalDissipation_W: number;
  /** Cooling power needed to hold the target internal temperature (≥ 0), W. */
  coolingPower_W: number;
  naturalCoolingSuffices: boolean;
  /** Airflow of a filter fan holding the target, m³/s; null when not needed or not possible (target ≤ ambient). */
  fanAirflow_m3_s: number | null;
}

export function calcEnclosureHeat(raw: EnclosureHeatInput): CalcResult<EnclosureHeatResults> {
  const parsed = enclosureHeatSchema.safeParse(raw);
  if (!parsed.success) {
    const [field, message] = Object.entries(fieldErrors(parsed.error))[0] ?? ["_", "invalid input"];
    throw new EngineError("invalid-input", message, field);
  }
  const inp = parsed.data;
  const warnings: Warning[] = [];
  const checks: Check[] = [];
  const intermediates: Record<string, Quantity> = {};

  const lines: LossLine[] = inp.losses.map((r) => ({ name: r.name, sourceSheet: r.sourceSheet ?? null, loss_W: r.loss_W * r.quantity * r.loadFactor * r.loadFactor }));
  const P = lines.reduce((s, l) => s + l.loss_W, 0);
  const bySource: Record<string, number> = {};
  for (const l of lines) bySource[l.sourceSheet ?? "devices"] = (bySource[l.sourceSheet ?? "devices"] ?? 0) + l.loss_W;

  const surfaces = coolingSurfaces(inp.width_m, inp.height_m, inp.depth_m, inp.installation);
  const Ae = surfaces.reduce((s, r) => s + r.effective_m2, 0);
  const kA = inp.heatTransfer_W_m2K * Ae;
  const dT = P / kA;
  const avg = inp.ambient_C + dT;
  const top = inp.topFactor !== undefined ? inp.ambient_C + inp.topFactor * dT : null;
  const natural = kA * (inp.targetInternal_C - inp.ambient_C);
  const Pcool = Math.max(0, P - natural);
  const governing = top ?? avg;
  const suffices = governing <= inp.targetInternal_C;

  let airflow: number | null = null;
  const allowedRise = inp.targetInternal_C - inp.ambient_C;
  if (!suffices && allowedRise > 0) airflow = Pcool / (airVolumetricHeatCapacity(inp.ambient_C) * allowedRise);

  intermediates.P = q("Total power loss P", P, "W");
  intermediates.Ae = q("Effective cooling surface A_e", Ae, "m²");
  intermediates.kA = q("Heat dissipated per kelvin k·A_e", kA, "W/K");
  intermediates.deltaT = q("Average internal air temperature rise ΔT", dT, "K");
  intermediates.internalAverage = q("Average internal air temperature", avg, "°C");
  if (top !== null) intermediates.internalTop = q("Air temperature at the top", top, "°C");
  intermediates.natural = q("Natural dissipation at the target temperature", natural, "W");
  intermediates.coolingPower = q("Cooling power needed", Pcool, "W");
  if (airflow !== null) intermediates.airflow = q("Filter-fan airflow", airflow * 3600, "m³/h");

  const formulas: Formula[] = [
    { id: "loss-sum", expression: "P = Σ P_n·N·(I_B/I_n)²", source: "IEC TR 60890:2014 (sum of the effective power losses); loss ∝ current² — common practice (Joule losses)" },
    { id: "cooling-surface", expression: "A_e = Σ A_0·b (floor not counted)", source: SURFACE_FACTOR_SOURCE },
    { id: "temperature-rise", expression: "ΔT = P/(k·A_e), k = " + inp.heatTransfer_W_m2K + " W/(m²·K)", source: "Steady heat balance; k = 5.5 W/(m²·K) for painted sheet steel is common practice. Verification method: IEC TR 60890:2014; requirement: IEC 61439-1:2020 §10.10" },
    { id: "cooling-power", expression: "P_cool = max(0, P − k·A_e·(θ_target − θ_ambient))", source: "Steady heat balance at the target internal temperature (common practice)" },
  ];
  if (top !== null) formulas.push({ id: "top-temperature", expression: "θ_top = θ_ambient + c·ΔT", source: "IEC TR 60890:2014 temperature-distribution factor c (entered)" });
  if (airflow !== null)
    formulas.push({ id: "fan-airflow", expression: "V̇ = P_cool/(ρ·c_p·(θ_target − θ_ambient)), ρ = p/(R·T)", source: "Energy balance of the air stream; air properties: Incropera 6th ed. Table A.4, ISO 2533" });

  if (P === 0) warnings.push({ code: "no-losses", message: "No power losses entered: the internal temperature equals the ambient" });
  if (inp.ratedCurrent_A !== undefined && inp.ratedCurrent_A > 1600)
    warnings.push({ code: "tr60890-scope", message: `Rated current ${inp.ratedCurrent_A} A exceeds 1600 A: IEC 61439-1:2020 §10.10.4.3 allows verification by IEC TR 60890 calculation only up to 1600 A (from memory); verify by test` });
  if (inp.topFactor === undefined) warnings.push({ code: "average-only", message: "Average internal air temperature only: the air at the top of the enclosure is hotter (enter the IEC TR 60890 factor c for the top temperature)" });
  if (inp.targetInternal_C <= inp.ambient_C && P > 0)
    warnings.push({ code: "target-below-ambient", message: `Target ${inp.targetInternal_C} °C is not above the ambient ${inp.ambient_C} °C: natural or fan cooling cannot reach it; an air conditioner (closed-loop cooling) is needed` });
  if (!suffices && allowedRise > 0)
    warnings.push({ code: "ventilation", message: `Natural cooling does not suffice: remove ${Pcool.toFixed(0)} W, e.g. ventilation openings, a filter fan of about ${((airflow ?? 0) * 3600).toFixed(0)} m³/h, or an air conditioner; ventilated enclosures are treated by IEC TR 60890 with their own constants` });

  checks.push(check("internal-temperature", top !== null ? "Top-of-enclosure air temperature" : "Average internal air temperature", governing, inp.targetInternal_C, "°C"));

  return {
    kind: "enclosure-heat",
    engineVersion: ENGINE_VERSION,
    results: {
      totalLoss_W: P,
      lossBySource_W: bySource,
      lines,
      surfaces,
      effectiveSurface_m2: Ae,
      deltaT_K: dT,
      internalAverage_C: avg,
      internalTop_C: top,
      naturalDissipation_W: natural,
      coolingPower_W: Pcool,
      naturalCoolingSuffices: suffices,
      fanAirflow_m3_s: airflow,
    },
    intermediates,
    formulas,
    warnings,
    checks,
  };
}
