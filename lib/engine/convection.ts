/**
 * Natural (free) convection correlations: average Nusselt number from the Rayleigh
 * number. The functions return plain numbers (they sit in the inner loop of the
 * busbar heat balance); `rangeWarning` says when a Rayleigh number lies outside the
 * range a correlation was fitted over — the value is still returned.
 */
import type { Warning } from "./core/result";
import type { AirProperties } from "./air";
import { G_STANDARD } from "./air";

export type Correlation = "vertical-plate" | "plate-up" | "plate-down" | "horizontal-cylinder" | "vertical-channel";

/** Validity range in Ra of each correlation, as stated by its source. */
export const RA_RANGE: Record<Correlation, { min: number; max: number; source: string }> = {
  "vertical-plate": { min: 0, max: 1e12, source: "Churchill & Chu 1975; Incropera 6th ed. eq. 9.26 (all Ra ≤ 10¹²)" },
  "plate-up": { min: 1e4, max: 1e11, source: "Incropera 6th ed. eq. 9.30 (10⁴–10⁷) and 9.31 (10⁷–10¹¹)" },
  "plate-down": { min: 1e5, max: 1e10, source: "Incropera 6th ed. eq. 9.32 (10⁵–10¹⁰)" },
  "horizontal-cylinder": { min: 0, max: 1e12, source: "Churchill & Chu 1975; Incropera 6th ed. eq. 9.34 (Ra_D ≤ 10¹²)" },
  "vertical-channel": { min: 0, max: Infinity, source: "Bar-Cohen & Rohsenow 1984; Incropera 6th ed. eq. 9.45 (composite, all Ra_S·S/L)" },
};

/** Ra_L = g·β·ΔT·L³/(ν·α) — Incropera 6th ed. eq. 9.25. */
export function rayleigh(deltaT_K: number, L_m: number, air: Pick<AirProperties, "beta" | "nu" | "alpha">, g: number = G_STANDARD): number {
  return (g * air.beta * deltaT_K * L_m * L_m * L_m) / (air.nu * air.alpha);
}

/**
 * Vertical plate, all Ra: Nu_L = {0.825 + 0.387·Ra^(1/6)/[1 + (0.492/Pr)^(9/16)]^(8/27)}²
 * — S. W. Churchill, H. H. S. Chu, Int. J. Heat Mass Transfer 18 (1975) 1323–1329;
 * Incropera 6th ed. eq. 9.26. L = plate height.
 */
export function nuVerticalPlate(Ra: number, Pr: number): number {
  return nuVerticalPlateWithPsi(Ra, churchillChuPsi(Pr));
}

/** The Prandtl factor ψ = [1 + (0.492/Pr)^(9/16)]^(8/27) of eq. 9.26, for reuse across surfaces. */
export function churchillChuPsi(Pr: number): number {
  return Math.pow(1 + Math.pow(0.492 / Pr, 9 / 16), 8 / 27);
}

/** eq. 9.26 with ψ precomputed (hot loops). */
export function nuVerticalPlateWithPsi(Ra: number, psi: number): number {
  const s = 0.825 + (0.387 * Math.pow(Ra, 1 / 6)) / psi;
  return s * s;
}

/**
 * Vertical plate, laminar range (Ra ≤ 10⁹), slightly more accurate there:
 * Nu_L = 0.68 + 0.670·Ra^(1/4)/[1 + (0.492/Pr)^(9/16)]^(4/9) — Churchill & Chu 1975;
 * Incropera 6th ed. eq. 9.27.
 */
export function nuVerticalPlateLaminar(Ra: number, Pr: number): number {
  return 0.68 + (0.67 * Math.pow(Ra, 0.25)) / Math.pow(1 + Math.pow(0.492 / Pr, 9 / 16), 4 / 9);
}

/**
 * Upper surface of a heated horizontal plate (or lower surface of a cooled one):
 * Nu_L = 0.54·Ra^(1/4) for 10⁴ ≤ Ra ≤ 10⁷, 0.15·Ra^(1/3) for 10⁷ ≤ Ra ≤ 10¹¹,
 * L = A_s/P — Incropera 6th ed. §9.6.3 eqs. 9.29–9.31 (after Lloyd & Moran 1974 and
 * McAdams 1954).
 */
export function nuPlateUp(Ra: number): number {
  return Ra <= 1e7 ? 0.54 * Math.pow(Ra, 0.25) : 0.15 * Math.cbrt(Ra);
}

/**
 * Lower surface of a heated horizontal plate: Nu_L = 0.27·Ra^(1/4), 10⁵ ≤ Ra ≤ 10¹⁰,
 * L = A_s/P — Incropera 6th ed. §9.6.3 eq. 9.32 (McAdams 1954).
 */
export function nuPlateDown(Ra: number): number {
  return 0.27 * Math.pow(Ra, 0.25);
}

/**
 * Long horizontal cylinder: Nu_D = {0.60 + 0.387·Ra_D^(1/6)/[1 + (0.559/Pr)^(9/16)]^(8/27)}²,
 * Ra_D ≤ 10¹² — S. W. Churchill, H. H. S. Chu, Int. J. Heat Mass Transfer 18 (1975)
 * 1049–1053; Incropera 6th ed. eq. 9.34.
 */
export function nuHorizontalCylinder(Ra_D: number, Pr: number): number {
  const psi = Math.pow(1 + Math.pow(0.559 / Pr, 9 / 16), 8 / 27);
  const s = 0.6 + (0.387 * Math.pow(Ra_D, 1 / 6)) / psi;
  return s * s;
}

/**
 * Channel between two parallel vertical isothermal plates at the same temperature,
 * open at top and bottom, spacing S, height L:
 * Nu_S = [C1/(Ra_S·S/L)² + C2/(Ra_S·S/L)^(1/2)]^(−1/2), C1 = 576, C2 = 2.87 —
 * A. Bar-Cohen, W. M. Rohsenow, J. Heat Transfer 106 (1984) 116–123; Incropera 6th ed.
 * eq. 9.45 and Table 9.3 (symmetric isothermal plates). Nu_S = q″·S/(k·(T_s − T_∞)), with
 * q″ the flux from each wall. Small-spacing limit: the fully developed value of
 * Elenbaas (Physica 9, 1942) Ra_S·(S/L)/24; large spacing: isolated plates.
 */
export function nuVerticalChannel(Ra_S: number, S_m: number, L_m: number): number {
  const x = (Ra_S * S_m) / L_m;
  if (!(x > 0)) return 0;
  return Math.pow(576 / (x * x) + 2.87 / Math.sqrt(x), -0.5);
}

/** A warning when Ra lies outside the correlation's fitted range; undefined inside it. */
export function rangeWarning(correlation: Correlation, Ra: number, surface: string): Warning | undefined {
  const r = RA_RANGE[correlation];
  if (Ra >= r.min && Ra <= r.max) return undefined;
  const fmt = (x: number) => (x === 0 ? "0" : x.toExponential(1));
  return {
    code: "convection-ra-out-of-range",
    message: `${surface}: Rayleigh number ${fmt(Ra)} is outside ${fmt(r.min)}–${fmt(r.max)}, the range of the ${correlation} correlation (${r.source}); the correlation is extrapolated`,
  };
}

/** h = Nu·k/L, W/(m²·K). */
export function hFromNu(Nu: number, k: number, L_m: number): number {
  return (Nu * k) / L_m;
}
