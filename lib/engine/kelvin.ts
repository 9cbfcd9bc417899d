/**
 * Kelvin functions ber, bei and their derivatives, and the exact skin-effect ratio of
 * an isolated round conductor.
 *
 * Definitions and series: M. Abramowitz & I. A. Stegun, Handbook of Mathematical
 * Functions, §9.9 (eq. 9.9.10: ber x + i·bei x = I0(x·e^{iπ/4}) = J0(x·e^{3πi/4})).
 * Large argument: the Hankel asymptotic expansion of I_ν(z), A&S 9.7.1, evaluated at
 * z = x·e^{iπ/4} (|arg z| < π/2, so the e^{−z} part is exponentially small).
 */

/** Above this argument the asymptotic expansion is used; the series below it. */
export const KELVIN_SERIES_LIMIT = 20;

export interface KelvinValues {
  ber: number;
  bei: number;
  /** d ber/dx */
  berp: number;
  /** d bei/dx */
  beip: number;
}

/**
 * Power series, A&S 9.9.10:
 * ber x = Σ (−1)^k (x/2)^{4k}/((2k)!)², bei x = Σ (−1)^k (x/2)^{4k+2}/((2k+1)!)².
 * Derivatives by differentiating term by term.
 */
export function kelvinSeries(x: number): KelvinValues {
  if (x === 0) return { ber: 1, bei: 0, berp: 0, beip: 0 };
  const h2 = (x / 2) ** 2;
  let ber = 0, bei = 0, berp = 0, beip = 0;
  // t_m = (x/2)^{2m}/(m!)²: ber takes even m with sign (−1)^{m/2}, bei odd m with sign (−1)^{(m−1)/2};
  // d t_m/dx = t_m·2m/x.
  let t = 1;
  for (let m = 0; m < 400; m++) {
    if (m > 0) t *= h2 / (m * m);
    const sign = (m >> 1) % 2 === 0 ? 1 : -1;
    const dt = (t * 2 * m) / x;
    if (m % 2 === 0) {
      ber += sign * t;
      berp += sign * dt;
    } else {
      bei += sign * t;
      beip += sign * dt;
    }
    if (m * m > h2 && t < 1e-17 * (1 + Math.abs(ber) + Math.abs(bei)) && dt < 1e-17 * (1 + Math.abs(berp) + Math.abs(beip))) break;
  }
  return { ber, bei, berp, beip };
}

interface C {
  re: number;
  im: number;
}
const cmul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const cdiv = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};

/**
 * I_ν(z)·√(2πz)·e^{−z} by A&S 9.7.1: Σ_k (−1)^k·a_k(ν)/z^k, a_k = Π_{j=1..k}(4ν² − (2j−1)²)/(k!·8^k),
 * summed until the terms stop decreasing (optimal truncation).
 */
function besselIScaledAsymptotic(nu: number, z: C): C {
  const mu = 4 * nu * nu;
  let sum: C = { re: 1, im: 0 };
  let term: C = { re: 1, im: 0 };
  let last = Infinity;
  for (let k = 1; k < 60; k++) {
    const factor = -(mu - (2 * k - 1) ** 2) / (k * 8);
    const next = cdiv({ re: term.re * factor, im: term.im * factor }, z);
    const mag = Math.hypot(next.re, next.im);
    if (mag > last || mag === 0) break;
    term = next;
    last = mag;
    sum = { re: sum.re + term.re, im: sum.im + term.im };
    if (mag < 1e-17) break;
  }
  return sum;
}

/** Asymptotic ber, bei, ber′, bei′ for large x (A&S 9.7.1 with z = x·e^{iπ/4}; ber′ + i·bei′ = e^{iπ/4}·I1(z)). */
export function kelvinAsymptotic(x: number): KelvinValues {
  const c = Math.SQRT1_2;
  const z: C = { re: x * c, im: x * c };
  // e^z/√(2πz)
  const sqrt2piz = { re: Math.sqrt(2 * Math.PI * x) * Math.cos(Math.PI / 8), im: Math.sqrt(2 * Math.PI * x) * Math.sin(Math.PI / 8) };
  const ez = { re: Math.exp(z.re) * Math.cos(z.im), im: Math.exp(z.re) * Math.sin(z.im) };
  const pre = cdiv(ez, sqrt2piz);
  const i0 = cmul(pre, besselIScaledAsymptotic(0, z));
  const i1 = cmul(pre, besselIScaledAsymptotic(1, z));
  const d = cmul({ re: c, im: c }, i1);
  return { ber: i0.re, bei: i0.im, berp: d.re, beip: d.im };
}

/** ber, bei, ber′, bei′ at x ≥ 0: series up to KELVIN_SERIES_LIMIT, asymptotic above. */
export function kelvin(x: number): KelvinValues {
  if (!(x >= 0) || !Number.isFinite(x)) throw new RangeError(`Kelvin functions: x must be a finite number ≥ 0, got ${x}`);
  return x <= KELVIN_SERIES_LIMIT ? kelvinSeries(x) : kelvinAsymptotic(x);
}

/**
 * Exact Rac/Rdc of an isolated straight round solid conductor (return path far away):
 *   Rac/Rdc = (x/2)·(ber x·bei′x − bei x·ber′x)/(ber′x² + bei′x²),
 * x = r·√(ωμσ) = √2·r/δ — S. Ramo, J. R. Whinnery, T. Van Duzer, Fields and Waves in
 * Communication Electronics, §5.13 (internal impedance of a round wire); equivalently
 * Re[(z/2)·I0(z)/I1(z)], z = x·e^{iπ/4}. With μ = μ0, x equals IEC 60287-1-1's x_s
 * for k_s = 1.
 */
export function roundSkinRatioExact(x: number): number {
  if (x === 0) return 1;
  const k = kelvin(x);
  return ((x / 2) * (k.ber * k.beip - k.bei * k.berp)) / (k.berp * k.berp + k.beip * k.beip);
}

/** Internal reactance over Rdc of the same conductor: (x/2)·(ber·ber′ + bei·bei′)/(ber′² + bei′²) (same source). */
export function roundInternalReactanceRatioExact(x: number): number {
  if (x === 0) return 0;
  const k = kelvin(x);
  return ((x / 2) * (k.ber * k.berp + k.bei * k.beip)) / (k.berp * k.berp + k.beip * k.beip);
}

/** x = r·√(ωμ0σ) for a round conductor of radius r, m, and resistivity ρ, Ω·m. */
export function kelvinArgument(radius_m: number, frequency_Hz: number, resistivity_ohm_m: number): number {
  return radius_m * Math.sqrt((2 * Math.PI * frequency_Hz * 4e-7 * Math.PI) / resistivity_ohm_m);
}
