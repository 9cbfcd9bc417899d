/**
 * Dry air properties for natural convection, at the film temperature.
 *
 * Table: F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, Fundamentals of
 * Heat and Mass Transfer, 6th ed., Wiley 2007, Appendix A, Table A.4 "Thermophysical
 * properties of gases at atmospheric pressure" — air, rows 250…500 K, interpolated
 * linearly (as the book's own worked examples do). Outside 250–500 K the end segments
 * are extrapolated linearly and `inTableRange` is false, so callers can warn.
 */

/** Standard gravity, m/s² (3rd CGPM 1901; ISO 80000-3). */
export const G_STANDARD = 9.80665;
/** Standard sea-level pressure, Pa (ISO 2533:1975 standard atmosphere). */
export const P_SEA_LEVEL = 101325;

/** One row of Incropera Table A.4 (air, 1 atm), in SI. */
interface AirRow {
  T_K: number;
  rho: number; // kg/m³
  cp: number; // J/(kg·K)
  mu: number; // N·s/m²
  nu: number; // m²/s
  k: number; // W/(m·K)
  alpha: number; // m²/s
  Pr: number;
}

// Incropera 6th ed. Table A.4, air; the book prints μ·10⁷, ν·10⁶, k·10³, α·10⁶.
const TABLE_A4: readonly AirRow[] = [
  { T_K: 250, rho: 1.3947, cp: 1006, mu: 159.6e-7, nu: 11.44e-6, k: 22.3e-3, alpha: 15.9e-6, Pr: 0.720 },
  { T_K: 300, rho: 1.1614, cp: 1007, mu: 184.6e-7, nu: 15.89e-6, k: 26.3e-3, alpha: 22.5e-6, Pr: 0.707 },
  { T_K: 350, rho: 0.995, cp: 1009, mu: 208.2e-7, nu: 20.92e-6, k: 30.0e-3, alpha: 29.9e-6, Pr: 0.700 },
  { T_K: 400, rho: 0.8711, cp: 1014, mu: 230.1e-7, nu: 26.41e-6, k: 33.8e-3, alpha: 38.3e-6, Pr: 0.690 },
  { T_K: 450, rho: 0.774, cp: 1021, mu: 250.7e-7, nu: 32.39e-6, k: 37.3e-3, alpha: 47.2e-6, Pr: 0.686 },
  { T_K: 500, rho: 0.6964, cp: 1030, mu: 270.1e-7, nu: 38.79e-6, k: 40.7e-3, alpha: 56.7e-6, Pr: 0.684 },
];

export const AIR_TABLE_MIN_K = 250;
export const AIR_TABLE_MAX_K = 500;
export const AIR_TABLE_SOURCE = "Incropera, DeWitt, Bergman, Lavine, Fundamentals of Heat and Mass Transfer, 6th ed., Table A.4 (air at 1 atm), linear interpolation";

export interface AirProperties {
  /** Film temperature, K. */
  T_K: number;
  /** Thermal conductivity, W/(m·K). */
  k: number;
  /** Kinematic viscosity, m²/s (at the given pressure). */
  nu: number;
  /** Thermal diffusivity, m²/s (at the given pressure). */
  alpha: number;
  Pr: number;
  /** Volumetric expansion coefficient of an ideal gas, 1/T, 1/K. */
  beta: number;
  /** Density, kg/m³ (at the given pressure). */
  rho: number;
  /** Dynamic viscosity, N·s/m². */
  mu: number;
  /** True when T lies inside the table (250–500 K). */
  inTableRange: boolean;
}

/**
 * Air properties at film temperature T_K and pressure p. Pressure enters through the
 * density only: for an ideal gas k, μ, c_p and Pr do not depend on pressure at these
 * conditions, so ν = μ/ρ and α = k/(ρ·c_p) scale with p₀/p (Incropera §9.1 remarks;
 * common practice for altitude correction of natural convection).
 */
export function airProperties(T_K: number, pressure_Pa: number = P_SEA_LEVEL): AirProperties {
  const rows = TABLE_A4;
  let i = 0;
  while (i < rows.length - 2 && T_K > rows[i + 1]!.T_K) i++;
  const a = rows[i]!;
  const b = rows[i + 1]!;
  const f = (T_K - a.T_K) / (b.T_K - a.T_K);
  const lerp = (x: number, y: number) => x + f * (y - x);
  const s = P_SEA_LEVEL / pressure_Pa;
  return {
    T_K,
    k: lerp(a.k, b.k),
    nu: lerp(a.nu, b.nu) * s,
    alpha: lerp(a.alpha, b.alpha) * s,
    Pr: lerp(a.Pr, b.Pr),
    beta: 1 / T_K,
    rho: lerp(a.rho, b.rho) / s,
    mu: lerp(a.mu, b.mu),
    inTableRange: T_K >= AIR_TABLE_MIN_K && T_K <= AIR_TABLE_MAX_K,
  };
}

/** Film temperature in K from surface and ambient temperatures in °C (Incropera eq. 7.2). */
export function filmTemperatureK(surface_C: number, ambient_C: number): number {
  return (surface_C + ambient_C) / 2 + 273.15;
}

/**
 * Pressure at altitude h (m) in the ISA troposphere (0–11 km):
 * p = p₀·(1 − L·h/T₀)^(g·M/(R·L)), p₀ = 101 325 Pa, T₀ = 288.15 K, L = 0.0065 K/m,
 * exponent 5.25588 — ISO 2533:1975 Standard Atmosphere (barometric formula).
 */
export function pressureAtAltitude(altitude_m: number): number {
  return P_SEA_LEVEL * Math.pow(1 - (0.0065 * altitude_m) / 288.15, 5.25588);
}
