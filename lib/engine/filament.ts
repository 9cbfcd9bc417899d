/**
 * Skin and proximity effect in rectangular conductors by the partial-inductance
 * filament method: W. T. Weeks, L. L. Wu, M. F. McAllister, A. Singh, "Resistive and
 * inductive skin effect in rectangular conductors", IBM J. Res. Dev. 23(6), 1979.
 *
 * Each conductor is cut into rectangular filaments carrying uniform current. Per unit
 * length (2-D, long straight parallel conductors), filament i has resistance
 * R_i = ρ/(w_i·h_i) and the partial inductances are
 *   L_ij = −(μ0/2π)·(ln g_ij − ln D),
 * with g_ij the geometric mean distance between the two rectangles (exact closed form
 * below; for i = j the self-GMD of a rectangle, ≈ 0.2235·(w + h) — F. W. Grover,
 * Inductance Calculations, ch. 3) and D a reference (return) radius. When the imposed
 * phase currents sum to zero, D cancels; for a single isolated pack it only shifts the
 * reactance (the current distribution does not depend on it).
 *
 * All filaments of one phase share one voltage per metre (the bars of a phase are in
 * parallel and joined at both ends); the phase currents are imposed:
 *   (R + jωL)·I = B·V,   Bᵀ·I = I_phase.
 */
import type { BarArrangement } from "./geometry";
import { barCentres, packThickness } from "./geometry";

const MU0_OVER_2PI = 2e-7; // μ0/2π in H/m (μ0 = 4π·10⁻⁷ H/m)

/** A rectangular conductor or filament in the cross-section: centre (x, y), size w (along x) × h (along y), m. */
export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface FilamentConductor extends Rect {
  /** Phase index (0-based); all filaments of a phase are at one voltage. */
  phase: number;
  /** Optional label of the conductor (bar) the filament belongs to. */
  bar?: number;
}

// ---------------------------------------------------------------------------------
// Geometric mean distance of two rectangles
// ---------------------------------------------------------------------------------

/**
 * Fourth antiderivative G with ∂⁴G/∂X²∂Y² = ln(X² + Y²); the mean of ln r² over two
 * rectangles is the signed sum of G over the 16 corner differences, divided by the two
 * areas. Closed form as used for rectangular-bar partial inductance (Weeks et al. 1979,
 * eq. for the 2-D mutual term; Grover ch. 3); checked here against Grover's self-GMD
 * of a square, 0.44705·a.
 */
function g4(x: number, y: number): number {
  const x2 = x * x;
  const y2 = y * y;
  const r2 = x2 + y2;
  if (r2 === 0) return 0;
  let v = (x2 * y2 / 4 - (x2 * x2) / 24 - (y2 * y2) / 24) * Math.log(r2) - (25 / 24) * x2 * y2;
  if (x !== 0) v += ((x2 * x * y) / 3) * Math.atan(y / x);
  if (y !== 0) v += ((x * y2 * y) / 3) * Math.atan(x / y);
  return v;
}

/**
 * ln of the geometric mean distance between two rectangles (or of one rectangle with
 * itself). Exact closed form when they are near; the centre distance when they are
 * farther apart than 6 times their larger dimension (the error there is below 10⁻³ in
 * ln g, and the closed form would lose digits to cancellation).
 */
export function lnGmd(a: Rect, b: Rect): number {
  const dx = a.x - b.x;
  const dy = a.y - b.y;
  const d2 = dx * dx + dy * dy;
  const size = Math.max(a.w, a.h, b.w, b.h);
  if (d2 > 36 * size * size) return 0.5 * Math.log(d2);
  const xa0 = a.x - a.w / 2, xa1 = a.x + a.w / 2, xb0 = b.x - b.w / 2, xb1 = b.x + b.w / 2;
  const ya0 = a.y - a.h / 2, ya1 = a.y + a.h / 2, yb0 = b.y - b.h / 2, yb1 = b.y + b.h / 2;
  const X = [xa1 - xb0, xa0 - xb0, xa1 - xb1, xa0 - xb1];
  const Y = [ya1 - yb0, ya0 - yb0, ya1 - yb1, ya0 - yb1];
  const S = [1, -1, -1, 1];
  let s = 0;
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) s += S[i]! * S[j]! * g4(X[i]!, Y[j]!);
  return s / (2 * a.w * a.h * b.w * b.h);
}

// ---------------------------------------------------------------------------------
// Dense complex solve
// ---------------------------------------------------------------------------------

/**
 * Solves A·X = B for complex A (n×n, row-major, real and imaginary parts in separate
 * arrays, overwritten by its LU factors) and `nrhs` right-hand sides B (n×nrhs,
 * row-major, overwritten by X). Gaussian elimination with partial pivoting on |a|
 * (Golub & Van Loan, Matrix Computations, 4th ed., §3.4, Algorithm 3.4.1).
 * Throws when the matrix is singular to working precision.
 */
export function solveComplexDense(n: number, aRe: Float64Array, aIm: Float64Array, bRe: Float64Array, bIm: Float64Array, nrhs: number): void {
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const m = Math.hypot(aRe[i * n + k]!, aIm[i * n + k]!);
      if (m > best) {
        best = m;
        p = i;
      }
    }
    if (!(best > 0)) throw new Error(`complex solve: matrix is singular at column ${k}`);
    if (p !== k) {
      swapRows(aRe, n, k, p, n);
      swapRows(aIm, n, k, p, n);
      swapRows(bRe, nrhs, k, p, nrhs);
      swapRows(bIm, nrhs, k, p, nrhs);
    }
    const kk = k * n + k;
    const pr = aRe[kk]!;
    const pi = aIm[kk]!;
    const den = pr * pr + pi * pi;
    const ir = pr / den;
    const ii = -pi / den;
    const rowK = k * n;
    for (let i = k + 1; i < n; i++) {
      const rowI = i * n;
      const ar = aRe[rowI + k]!;
      const ai = aIm[rowI + k]!;
      if (ar === 0 && ai === 0) continue;
      const fr = ar * ir - ai * ii;
      const fi = ar * ii + ai * ir;
      aRe[rowI + k] = fr;
      aIm[rowI + k] = fi;
      for (let j = k + 1; j < n; j++) {
        const br = aRe[rowK + j]!;
        const bi = aIm[rowK + j]!;
        aRe[rowI + j] = aRe[rowI + j]! - (fr * br - fi * bi);
        aIm[rowI + j] = aIm[rowI + j]! - (fr * bi + fi * br);
      }
      for (let j = 0; j < nrhs; j++) {
        const br = bRe[k * nrhs + j]!;
        const bi = bIm[k * nrhs + j]!;
        bRe[i * nrhs + j] = bRe[i * nrhs + j]! - (fr * br - fi * bi);
        bIm[i * nrhs + j] = bIm[i * nrhs + j]! - (fr * bi + fi * br);
      }
    }
  }
  backSubstitute(n, aRe, aIm, bRe, bIm, nrhs);
}

/**
 * Solves A·X = B for complex symmetric A (A = Aᵀ, not Hermitian) by symmetric Gaussian
 * elimination without pivoting, working on the upper triangle only (half the work of
 * the general solve). Without pivoting this is stable when the real and imaginary
 * parts of A are both symmetric positive (semi)definite, as for R + jωL with R > 0 and
 * L a positive definite partial-inductance matrix: N. J. Higham, "Factorizing complex
 * symmetric matrices with positive definite real and imaginary parts", Math. Comp. 67
 * (1998) 1591–1599 (growth factor < 3). Returns false, leaving A and B in an undefined
 * state, when a pivot falls below 10⁻¹⁰ of the largest diagonal entry; the caller
 * then falls back to the pivoted solve.
 */
export function solveComplexSymmetric(n: number, aRe: Float64Array, aIm: Float64Array, bRe: Float64Array, bIm: Float64Array, nrhs: number): boolean {
  let dmax = 0;
  for (let k = 0; k < n; k++) dmax = Math.max(dmax, Math.hypot(aRe[k * n + k]!, aIm[k * n + k]!));
  const floor = 1e-10 * dmax;
  for (let k = 0; k < n; k++) {
    const rowK = k * n;
    const pr = aRe[rowK + k]!;
    const pi = aIm[rowK + k]!;
    if (!(Math.hypot(pr, pi) > floor)) return false;
    const den = pr * pr + pi * pi;
    const ir = pr / den;
    const ii = -pi / den;
    for (let i = k + 1; i < n; i++) {
      // multiplier m_ik = a_ki / a_kk (a_ik = a_ki by symmetry)
      const ar = aRe[rowK + i]!;
      const ai = aIm[rowK + i]!;
      if (ar === 0 && ai === 0) continue;
      const fr = ar * ir - ai * ii;
      const fi = ar * ii + ai * ir;
      const rowI = i * n;
      for (let j = i; j < n; j++) {
        const br = aRe[rowK + j]!;
        const bi = aIm[rowK + j]!;
        aRe[rowI + j] = aRe[rowI + j]! - (fr * br - fi * bi);
        aIm[rowI + j] = aIm[rowI + j]! - (fr * bi + fi * br);
      }
      for (let j = 0; j < nrhs; j++) {
        const br = bRe[k * nrhs + j]!;
        const bi = bIm[k * nrhs + j]!;
        bRe[i * nrhs + j] = bRe[i * nrhs + j]! - (fr * br - fi * bi);
        bIm[i * nrhs + j] = bIm[i * nrhs + j]! - (fr * bi + fi * br);
      }
    }
  }
  backSubstitute(n, aRe, aIm, bRe, bIm, nrhs);
  return true;
}

/** Solves U·X = B in place for the upper triangle U of a row-major complex matrix. */
function backSubstitute(n: number, aRe: Float64Array, aIm: Float64Array, bRe: Float64Array, bIm: Float64Array, nrhs: number): void {
  for (let k = n - 1; k >= 0; k--) {
    const kk = k * n + k;
    const pr = aRe[kk]!;
    const pi = aIm[kk]!;
    const den = pr * pr + pi * pi;
    for (let j = 0; j < nrhs; j++) {
      let sr = bRe[k * nrhs + j]!;
      let si = bIm[k * nrhs + j]!;
      for (let m = k + 1; m < n; m++) {
        const ar = aRe[k * n + m]!;
        const ai = aIm[k * n + m]!;
        const xr = bRe[m * nrhs + j]!;
        const xi = bIm[m * nrhs + j]!;
        sr -= ar * xr - ai * xi;
        si -= ar * xi + ai * xr;
      }
      bRe[k * nrhs + j] = (sr * pr + si * pi) / den;
      bIm[k * nrhs + j] = (si * pr - sr * pi) / den;
    }
  }
}

function swapRows(a: Float64Array, stride: number, r1: number, r2: number, len: number): void {
  const o1 = r1 * stride;
  const o2 = r2 * stride;
  for (let j = 0; j < len; j++) {
    const t = a[o1 + j]!;
    a[o1 + j] = a[o2 + j]!;
    a[o2 + j] = t;
  }
}

// ---------------------------------------------------------------------------------
// Filament solve
// ---------------------------------------------------------------------------------

export interface Complex {
  re: number;
  im: number;
}

export interface FilamentSolveOptions {
  frequency_Hz: number;
  resistivity_ohm_m: number;
  /** Imposed current of each phase (A or per-unit); length = number of phases. */
  phaseCurrents: Complex[];
  /** Reference radius D of the log kernel, m; default max(1 m, 2 × overall extent). */
  referenceRadius_m?: number;
}

export interface FilamentSolution {
  /** Filament currents (same unit as the phase currents). */
  current: Complex[];
  /** Voltage per metre of each phase. */
  phaseVoltage: Complex[];
  /** Loss per metre of each phase, Σ R_i·|I_i|² (W/m for currents in A). */
  phaseLoss: number[];
  /** DC resistance per metre of each phase, 1/Σ(1/R_i). */
  phaseRdc: number[];
  referenceRadius_m: number;
}

/**
 * Solves the filament system for conductors already cut into filaments. Phase indices
 * must be 0…P−1 with P = phaseCurrents.length, and every phase must own a filament.
 */
export function solveFilaments(filaments: FilamentConductor[], opts: FilamentSolveOptions): FilamentSolution {
  const n = filaments.length;
  const P = opts.phaseCurrents.length;
  if (n === 0 || P === 0) throw new Error("filament solve: no filaments or no phases");
  const counts = new Array<number>(P).fill(0);
  for (const f of filaments) {
    if (!Number.isInteger(f.phase) || f.phase < 0 || f.phase >= P) throw new Error(`filament solve: phase ${f.phase} outside 0…${P - 1}`);
    if (!(f.w > 0 && f.h > 0)) throw new Error("filament solve: filament with zero size");
    counts[f.phase]!++;
  }
  if (counts.some((c) => c === 0)) throw new Error("filament solve: a phase has no conductor");

  let xmin = Infinity, xmax = -Infinity, ymin = Infinity, ymax = -Infinity;
  for (const f of filaments) {
    xmin = Math.min(xmin, f.x - f.w / 2);
    xmax = Math.max(xmax, f.x + f.w / 2);
    ymin = Math.min(ymin, f.y - f.h / 2);
    ymax = Math.max(ymax, f.y + f.h / 2);
  }
  const extent = Math.hypot(xmax - xmin, ymax - ymin);
  const D = opts.referenceRadius_m ?? Math.max(1, 2 * extent);
  const lnD = Math.log(D);
  const omega = 2 * Math.PI * opts.frequency_Hz;
  const rho = opts.resistivity_ohm_m;

  const aRe = new Float64Array(n * n);
  const aIm = new Float64Array(n * n);
  const R = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const fi = filaments[i]!;
    R[i] = rho / (fi.w * fi.h);
    aRe[i * n + i] = R[i]!;
    for (let j = i; j < n; j++) {
      const x = omega * -MU0_OVER_2PI * (lnGmd(fi, filaments[j]!) - lnD);
      aIm[i * n + j] = x;
      aIm[j * n + i] = x;
    }
  }
  // Right-hand sides: B (n×P), column p is the indicator of phase p.
  const bRe = new Float64Array(n * P);
  const bIm = new Float64Array(n * P);
  for (let i = 0; i < n; i++) bRe[i * P + filaments[i]!.phase] = 1;
  const copy = [aRe.slice(), aIm.slice(), bRe.slice(), bIm.slice()] as const;
  if (!solveComplexSymmetric(n, aRe, aIm, bRe, bIm, P)) {
    aRe.set(copy[0]);
    aIm.set(copy[1]);
    bRe.set(copy[2]);
    bIm.set(copy[3]);
    solveComplexDense(n, aRe, aIm, bRe, bIm, P);
  }
  // Y = Bᵀ·X (P×P): phase currents for unit phase voltages.
  const yRe = new Float64Array(P * P);
  const yIm = new Float64Array(P * P);
  for (let i = 0; i < n; i++) {
    const p = filaments[i]!.phase;
    for (let q = 0; q < P; q++) {
      yRe[p * P + q] = yRe[p * P + q]! + bRe[i * P + q]!;
      yIm[p * P + q] = yIm[p * P + q]! + bIm[i * P + q]!;
    }
  }
  const vRe = new Float64Array(P);
  const vIm = new Float64Array(P);
  opts.phaseCurrents.forEach((c, p) => {
    vRe[p] = c.re;
    vIm[p] = c.im;
  });
  solveComplexDense(P, yRe, yIm, vRe, vIm, 1);
  const current: Complex[] = [];
  const phaseLoss = new Array<number>(P).fill(0);
  const phaseG = new Array<number>(P).fill(0);
  for (let i = 0; i < n; i++) {
    let re = 0;
    let im = 0;
    for (let q = 0; q < P; q++) {
      const xr = bRe[i * P + q]!;
      const xi = bIm[i * P + q]!;
      re += xr * vRe[q]! - xi * vIm[q]!;
      im += xr * vIm[q]! + xi * vRe[q]!;
    }
    current.push({ re, im });
    const p = filaments[i]!.phase;
    phaseLoss[p]! += R[i]! * (re * re + im * im);
    phaseG[p]! += 1 / R[i]!;
  }
  return {
    current,
    phaseVoltage: Array.from({ length: P }, (_, p) => ({ re: vRe[p]!, im: vIm[p]! })),
    phaseLoss,
    phaseRdc: phaseG.map((g) => 1 / g),
    referenceRadius_m: D,
  };
}

// ---------------------------------------------------------------------------------
// Meshing
// ---------------------------------------------------------------------------------

/** Default grading toward conductor surfaces (convergence study in tests/engine/filament.test.ts). */
export const DEFAULT_GRADING = 0.85;

/**
 * Cell boundaries on [0, 1] graded toward both ends: a blend of uniform spacing and
 * Chebyshev–Lobatto points, u_k = (1 − g)·k/n + g·(1 − cos(πk/n))/2. Current crowds
 * to the surfaces of a conductor, so smaller cells there (common practice in filament
 * and finite-element meshing).
 */
export function gradedDivisions(n: number, grading = DEFAULT_GRADING): number[] {
  const out: number[] = [];
  for (let k = 0; k <= n; k++) out.push((1 - grading) * (k / n) + (grading * (1 - Math.cos((Math.PI * k) / n))) / 2);
  return out;
}

/** Cuts a rectangle into nx × ny graded filaments. */
export function meshRectangle(r: Rect, nx: number, ny: number, grading = DEFAULT_GRADING): Rect[] {
  const ux = gradedDivisions(nx, grading);
  const uy = gradedDivisions(ny, grading);
  const out: Rect[] = [];
  const x0 = r.x - r.w / 2;
  const y0 = r.y - r.h / 2;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      const xa = x0 + ux[i]! * r.w, xb = x0 + ux[i + 1]! * r.w;
      const ya = y0 + uy[j]! * r.h, yb = y0 + uy[j + 1]! * r.h;
      out.push({ x: (xa + xb) / 2, y: (ya + yb) / 2, w: xb - xa, h: yb - ya });
    }
  }
  return out;
}

/**
 * Filament counts across the thickness and along the width of a bar for a target
 * count per bar: cells of roughly equal aspect, at least 3 across the thickness.
 */
export function barMeshCounts(width_m: number, thickness_m: number, filamentsPerBar: number): { nThickness: number; nWidth: number } {
  const nThickness = Math.max(3, Math.round(Math.sqrt((filamentsPerBar * thickness_m) / width_m)));
  const nWidth = Math.max(3, Math.round(filamentsPerBar / nThickness));
  return { nThickness, nWidth };
}

// ---------------------------------------------------------------------------------
// Busbar arrangement
// ---------------------------------------------------------------------------------

/** Default filaments per bar; see tests/engine/filament.test.ts for the convergence study behind it. */
export const DEFAULT_FILAMENTS_PER_BAR = 40;

export interface BarArrangementAcOptions {
  filamentsPerBar?: number;
  /** Mesh grading toward the bar surfaces, 0 (uniform) … 1 (Chebyshev). */
  grading?: number;
}

export interface BarAcShare {
  phase: number;
  bar: number;
  /** |I_bar| / |I_phase|. Equal sharing gives 1/barsPerPhase. */
  currentShare: number;
  /** Loss of this bar over its own DC loss at the same current: P_bar/(R_dc,bar·|I_bar|²). */
  racRatio: number;
  /** Loss of this bar over its DC loss at equal sharing: P_bar/(R_dc,bar·|I_phase/n|²). The hottest bar has the largest. */
  lossRatio: number;
}

export interface FilamentDensity {
  /** Centre and size in the drawing frame, m: "edge" bars stand with their width along y; "flat" bars lie with their width along x. */
  x: number;
  y: number;
  w: number;
  h: number;
  phase: number;
  bar: number;
  /** |J| / (|I_phase| / A_phase): 1 everywhere at DC. */
  jMagnitudeRelative: number;
}

export interface BarArrangementAcResult {
  filamentCount: number;
  filamentsPerBar: number;
  mesh: { nThickness: number; nWidth: number };
  /** DC resistance per metre of one phase (all its bars in parallel), Ω/m. */
  rdcPerPhase_ohm_m: number;
  /** AC resistance per metre of each phase, loss/|I|², Ω/m. */
  racPerPhase_ohm_m: number[];
  /** Rac/Rdc of each phase. */
  ratio: number[];
  /** Phase with the largest Rac (the centre phase of a three-phase row, usually). */
  worstPhase: number;
  racMax_ohm_m: number;
  ratioMax: number;
  /** Im(V_p/I_p) per metre, including the mutual coupling to the other phases, Ω/m. For one phase: return path at the reference radius. */
  reactancePerPhase_ohm_m: number[];
  referenceRadius_m: number;
  perBar: BarAcShare[];
  density: FilamentDensity[];
}

/** Balanced phase currents of unit magnitude: 1 phase: 1; 2 phases: +1, −1; 3 phases: 1∠0°, 1∠−120°, 1∠+120°. */
export function balancedPhaseCurrents(phases: number): Complex[] {
  if (phases === 1) return [{ re: 1, im: 0 }];
  if (phases === 2) return [{ re: 1, im: 0 }, { re: -1, im: 0 }];
  return Array.from({ length: phases }, (_, k) => ({ re: Math.cos((-2 * Math.PI * k) / phases), im: Math.sin((-2 * Math.PI * k) / phases) }));
}

/**
 * AC resistance of a busbar arrangement by the filament method, with balanced phase
 * currents. `resistivity_ohm_m` is at the operating temperature (see
 * materials.resistivityAt). Synchronous and pure.
 */
export function barArrangementAc(
  arr: BarArrangement,
  frequency_Hz: number,
  resistivity_ohm_m: number,
  opts: BarArrangementAcOptions = {},
): BarArrangementAcResult {
  if (!(arr.barWidth_m > 0 && arr.barThickness_m > 0)) throw new RangeError("bar width and thickness must be positive");
  if (!(Number.isInteger(arr.barsPerPhase) && arr.barsPerPhase >= 1)) throw new RangeError("bars per phase must be a whole number ≥ 1");
  if (!(arr.gap_m >= 0) && arr.barsPerPhase > 1) throw new RangeError("gap between bars must be ≥ 0");
  if (!(frequency_Hz >= 0) || !(resistivity_ohm_m > 0)) throw new RangeError("frequency must be ≥ 0 and resistivity > 0");
  if (arr.phases > 1 && !(arr.phaseSpacing_m >= packThickness(arr))) throw new RangeError("phase spacing must be at least the pack thickness (packs would overlap)");

  const target = Math.max(3, Math.round(opts.filamentsPerBar ?? DEFAULT_FILAMENTS_PER_BAR));
  const mesh = barMeshCounts(arr.barWidth_m, arr.barThickness_m, target);
  const filaments: FilamentConductor[] = [];
  for (const c of barCentres(arr)) {
    // Arrangement frame: x across the thickness, y along the width (geometry.ts).
    const cells = meshRectangle({ x: c.x, y: c.y, w: arr.barThickness_m, h: arr.barWidth_m }, mesh.nThickness, mesh.nWidth, opts.grading);
    for (const cell of cells) filaments.push({ ...cell, phase: c.phase, bar: c.bar });
  }
  const Iph = balancedPhaseCurrents(arr.phases);
  const sol = solveFilaments(filaments, { frequency_Hz, resistivity_ohm_m, phaseCurrents: Iph });

  const P = arr.phases;
  const nb = arr.barsPerPhase;
  const rdc = resistivity_ohm_m / (arr.barWidth_m * arr.barThickness_m * nb);
  const racPerPhase = sol.phaseLoss.map((loss, p) => loss / cabs2(Iph[p]!));
  const ratio = racPerPhase.map((r) => r / rdc);
  let worstPhase = 0;
  for (let p = 1; p < P; p++) if (racPerPhase[p]! > racPerPhase[worstPhase]! * (1 + 1e-9)) worstPhase = p;
  const reactance = sol.phaseVoltage.map((v, p) => cdiv(v, Iph[p]!).im);

  const barRdc = resistivity_ohm_m / (arr.barWidth_m * arr.barThickness_m);
  const perBar: BarAcShare[] = [];
  const acc = new Map<string, { re: number; im: number; loss: number }>();
  filaments.forEach((f, i) => {
    const key = `${f.phase}:${f.bar}`;
    const a = acc.get(key) ?? { re: 0, im: 0, loss: 0 };
    const c = sol.current[i]!;
    a.re += c.re;
    a.im += c.im;
    a.loss += (resistivity_ohm_m / (f.w * f.h)) * (c.re * c.re + c.im * c.im);
    acc.set(key, a);
  });
  for (let p = 0; p < P; p++) {
    const iph = Math.sqrt(cabs2(Iph[p]!));
    for (let b = 0; b < nb; b++) {
      const a = acc.get(`${p}:${b}`)!;
      const ib2 = a.re * a.re + a.im * a.im;
      perBar.push({
        phase: p,
        bar: b,
        currentShare: Math.sqrt(ib2) / iph,
        racRatio: a.loss / (barRdc * ib2),
        lossRatio: a.loss / (barRdc * (iph / nb) ** 2),
      });
    }
  }
  const phaseArea = arr.barWidth_m * arr.barThickness_m * nb;
  const flat = arr.orientation === "flat";
  const density: FilamentDensity[] = filaments.map((f, i) => {
    const c = sol.current[i]!;
    const j = Math.sqrt(c.re * c.re + c.im * c.im) / (f.w * f.h);
    const jdc = Math.sqrt(cabs2(Iph[f.phase]!)) / phaseArea;
    return {
      x: flat ? f.y : f.x,
      y: flat ? f.x : f.y,
      w: flat ? f.h : f.w,
      h: flat ? f.w : f.h,
      phase: f.phase,
      bar: f.bar ?? 0,
      jMagnitudeRelative: j / jdc,
    };
  });

  return {
    filamentCount: filaments.length,
    filamentsPerBar: mesh.nThickness * mesh.nWidth,
    mesh,
    rdcPerPhase_ohm_m: rdc,
    racPerPhase_ohm_m: racPerPhase,
    ratio,
    worstPhase,
    racMax_ohm_m: racPerPhase[worstPhase]!,
    ratioMax: ratio[worstPhase]!,
    reactancePerPhase_ohm_m: reactance,
    referenceRadius_m: sol.referenceRadius_m,
    perBar,
    density,
  };
}

function cabs2(c: Complex): number {
  return c.re * c.re + c.im * c.im;
}

function cdiv(a: Complex, b: Complex): Complex {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}
