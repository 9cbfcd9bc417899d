/**
 * Sparse symmetric systems for nodal analysis: compressed sparse row (CSR) storage
 * built from triplets, reverse Cuthill–McKee ordering, incomplete Cholesky IC(0)
 * in the L·D·Lᵀ form, preconditioned conjugate gradients for real symmetric positive
 * definite matrices and conjugate orthogonal CG (COCG) for complex symmetric ones.
 *
 * Sources:
 *  - CSR storage and IC(0): Y. Saad, Iterative Methods for Sparse Linear Systems,
 *    2nd ed., SIAM 2003, §3.4 (storage), §10.3 (ILU(0)/IC(0)), Algorithm 9.1 (PCG).
 *  - IC(0) existence for M-matrices: Meijerink & van der Vorst, Math. Comp. 31 (1977).
 *    Shifted IC when a pivot breaks down: T. A. Manteuffel, Math. Comp. 34 (1980).
 *  - Ordering: A. George & J. W. H. Liu, Computer Solution of Large Sparse Positive
 *    Definite Systems, Prentice-Hall 1981, §4.3 (RCM, pseudo-peripheral node).
 *    On a tree (a radial network) the RCM order eliminates every node before its
 *    BFS parent, so Cholesky makes no fill and IC(0) is the exact factor: PCG then
 *    converges in one step. Meshes add a few iterations.
 *  - COCG: H. A. van der Vorst & J. B. M. Melissen, "A Petrov–Galerkin type method
 *    for solving Ax = b, where A is symmetric complex", IEEE Trans. Magn. 26(2) 1990.
 *
 * Stopping test: ‖b − A·x‖₂ ≤ tol·‖b‖₂ on the recurrence residual (default
 * tol = 1e-12), then the true residual is recomputed from x (restarting from it when
 * it has drifted). `converged` is true when the true relative residual is ≤ 10·tol,
 * or the normwise backward error is at rounding level (≤ 64·ε, see ROUNDING_LEVEL).
 */

export interface CsrMatrix {
  n: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  values: Float64Array;
}

export interface ComplexCsrMatrix {
  n: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  re: Float64Array;
  im: Float64Array;
}

export const DEFAULT_TOLERANCE = 1e-12;

/** Collects (row, column, value) entries; duplicates are summed when compressed. */
export class TripletBuilder {
  private rows: Int32Array;
  private cols: Int32Array;
  private re: Float64Array;
  private im: Float64Array;
  private count = 0;

  constructor(
    public readonly n: number,
    capacity = 16,
  ) {
    if (!Number.isInteger(n) || n < 0) throw new RangeError(`matrix order must be a whole number ≥ 0, got ${n}`);
    const cap = Math.max(4, capacity);
    this.rows = new Int32Array(cap);
    this.cols = new Int32Array(cap);
    this.re = new Float64Array(cap);
    this.im = new Float64Array(cap);
  }

  get size(): number {
    return this.count;
  }

  add(i: number, j: number, re: number, im = 0): void {
    if (i < 0 || i >= this.n || j < 0 || j >= this.n) throw new RangeError(`entry (${i}, ${j}) outside a ${this.n}×${this.n} matrix`);
    if (this.count === this.rows.length) this.grow();
    const k = this.count++;
    this.rows[k] = i;
    this.cols[k] = j;
    this.re[k] = re;
    this.im[k] = im;
  }

  private grow(): void {
    const cap = this.rows.length * 2;
    const r = new Int32Array(cap);
    r.set(this.rows);
    const cl = new Int32Array(cap);
    cl.set(this.cols);
    const re = new Float64Array(cap);
    re.set(this.re);
    const im = new Float64Array(cap);
    im.set(this.im);
    this.rows = r;
    this.cols = cl;
    this.re = re;
    this.im = im;
  }

  /** Real CSR (imaginary parts ignored), rows sorted by column, duplicates summed. */
  toCsr(): CsrMatrix {
    const m = this.compress(false);
    return { n: m.n, rowPtr: m.rowPtr, colIdx: m.colIdx, values: m.re };
  }

  toComplexCsr(): ComplexCsrMatrix {
    return this.compress(true);
  }

  /** Two stable counting sorts (by column, then by row) give (row, column) order in O(nnz + n). */
  private compress(complex: boolean): ComplexCsrMatrix {
    const n = this.n;
    const nnz = this.count;
    const byCol = countingOrder(this.cols, nnz, n, null);
    const order = countingOrder(this.rows, nnz, n, byCol);
    const rowPtr = new Int32Array(n + 1);
    const colTmp = new Int32Array(nnz);
    const reTmp = new Float64Array(nnz);
    const imTmp = complex ? new Float64Array(nnz) : new Float64Array(0);
    let out = -1;
    let lastRow = -1;
    let lastCol = -1;
    for (let t = 0; t < nnz; t++) {
      const k = order[t]!;
      const i = this.rows[k]!;
      const j = this.cols[k]!;
      if (i === lastRow && j === lastCol) {
        reTmp[out] = reTmp[out]! + this.re[k]!;
        if (complex) imTmp[out] = imTmp[out]! + this.im[k]!;
      } else {
        out++;
        colTmp[out] = j;
        reTmp[out] = this.re[k]!;
        if (complex) imTmp[out] = this.im[k]!;
        rowPtr[i + 1] = rowPtr[i + 1]! + 1;
        lastRow = i;
        lastCol = j;
      }
    }
    for (let i = 0; i < n; i++) rowPtr[i + 1] = rowPtr[i + 1]! + rowPtr[i]!;
    const m = out + 1;
    return {
      n,
      rowPtr,
      colIdx: colTmp.slice(0, m),
      re: reTmp.slice(0, m),
      im: complex ? imTmp.slice(0, m) : new Float64Array(m),
    };
  }
}

/** Stable counting sort of entry indices by key (optionally starting from a prior order). */
function countingOrder(keys: Int32Array, nnz: number, n: number, prior: Int32Array | null): Int32Array {
  const count = new Int32Array(n + 1);
  for (let t = 0; t < nnz; t++) count[keys[t]! + 1]!++;
  for (let i = 0; i < n; i++) count[i + 1] = count[i + 1]! + count[i]!;
  const out = new Int32Array(nnz);
  for (let t = 0; t < nnz; t++) {
    const k = prior ? prior[t]! : t;
    const key = keys[k]!;
    out[count[key]!] = k;
    count[key]!++;
  }
  return out;
}

/** Builds a real CSR matrix from triplet arrays, summing duplicates. */
export function csrFromTriplets(n: number, rows: ArrayLike<number>, cols: ArrayLike<number>, values: ArrayLike<number>): CsrMatrix {
  if (rows.length !== cols.length || rows.length !== values.length) throw new RangeError("rows, cols and values must have the same length");
  const b = new TripletBuilder(n, rows.length);
  for (let k = 0; k < rows.length; k++) b.add(rows[k]!, cols[k]!, values[k]!);
  return b.toCsr();
}

/** y = A·x. */
export function csrMulVec(A: CsrMatrix, x: Float64Array, y: Float64Array): void {
  const { n, rowPtr, colIdx, values } = A;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) s += values[p]! * x[colIdx[p]!]!;
    y[i] = s;
  }
}

/** (yr + j·yi) = A·(xr + j·xi). */
export function complexCsrMulVec(A: ComplexCsrMatrix, xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
  const { n, rowPtr, colIdx, re, im } = A;
  for (let i = 0; i < n; i++) {
    let sr = 0;
    let si = 0;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      const j = colIdx[p]!;
      const ar = re[p]!;
      const ai = im[p]!;
      const br = xr[j]!;
      const bi = xi[j]!;
      sr += ar * br - ai * bi;
      si += ar * bi + ai * br;
    }
    yr[i] = sr;
    yi[i] = si;
  }
}

/** Converts a real CSR matrix to a dense array of rows (for tests and small checks). */
export function csrToDense(A: CsrMatrix): number[][] {
  const out: number[][] = [];
  for (let i = 0; i < A.n; i++) {
    const row = new Array<number>(A.n).fill(0);
    for (let p = A.rowPtr[i]!; p < A.rowPtr[i + 1]!; p++) row[A.colIdx[p]!] = A.values[p]!;
    out.push(row);
  }
  return out;
}

// ---------------------------------------------------------------------------------
// Ordering

interface Pattern {
  n: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
}

/**
 * Reverse Cuthill–McKee ordering of a symmetric pattern (George & Liu 1981, §4.3.1),
 * each connected component started from a pseudo-peripheral node (§4.3.2, the
 * Gibbs–Poole–Stockmeyer style search). Returns perm with perm[new] = old.
 */
export function rcmOrdering(A: Pattern): Int32Array {
  const { n, rowPtr, colIdx } = A;
  const degree = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let d = 0;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) if (colIdx[p] !== i) d++;
    degree[i] = d;
  }
  const placed = new Uint8Array(n);
  const stamp = new Int32Array(n).fill(-1);
  const level = new Int32Array(n);
  const queue = new Int32Array(n);
  const order = new Int32Array(n);
  let filled = 0;
  let bfsId = 0;
  const nbrBuf = new Int32Array(n);

  /** Rooted level structure; returns [number of levels, count] and leaves queue[0..count) holding the component. */
  const levels = (root: number): [number, number] => {
    const id = bfsId++;
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    stamp[root] = id;
    level[root] = 0;
    let depth = 0;
    while (head < tail) {
      const v = queue[head++]!;
      const lv = level[v]!;
      if (lv > depth) depth = lv;
      for (let p = rowPtr[v]!; p < rowPtr[v + 1]!; p++) {
        const w = colIdx[p]!;
        if (stamp[w] !== id && placed[w] === 0) {
          stamp[w] = id;
          level[w] = lv + 1;
          queue[tail++] = w;
        }
      }
    }
    return [depth + 1, tail];
  };

  for (let s = 0; s < n; s++) {
    if (placed[s]) continue;
    // Pseudo-peripheral node: repeat BFS from a minimum-degree node of the last level
    // while the eccentricity grows.
    let root = s;
    let [depth, count] = levels(root);
    for (let guard = 0; guard < 20; guard++) {
      let best = -1;
      for (let t = count - 1; t >= 0; t--) {
        const v = queue[t]!;
        if (level[v] !== depth - 1) break;
        if (best < 0 || degree[v]! < degree[best]!) best = v;
      }
      if (best < 0 || best === root) break;
      const [d2, c2] = levels(best);
      if (d2 > depth) {
        root = best;
        depth = d2;
        count = c2;
      } else {
        levels(root);
        break;
      }
    }
    // Cuthill–McKee: BFS visiting unnumbered neighbours by increasing degree.
    const start = filled;
    order[filled++] = root;
    placed[root] = 1;
    let head = start;
    while (head < filled) {
      const v = order[head++]!;
      // unnumbered neighbours by increasing (degree, index): insertion sort, the lists are short
      let cnt = 0;
      for (let p = rowPtr[v]!; p < rowPtr[v + 1]!; p++) {
        const w = colIdx[p]!;
        if (placed[w]) continue;
        placed[w] = 1;
        const dw = degree[w]!;
        let t = cnt++;
        while (t > 0) {
          const u = nbrBuf[t - 1]!;
          const du = degree[u]!;
          if (du < dw || (du === dw && u < w)) break;
          nbrBuf[t] = u;
          t--;
        }
        nbrBuf[t] = w;
      }
      for (let t = 0; t < cnt; t++) order[filled++] = nbrBuf[t]!;
    }
  }
  order.reverse();
  return order;
}

/**
 * B = P·A·Pᵀ with B[i][j] = A[perm[i]][perm[j]] (real or complex), written row by row
 * straight into CSR; each row's few entries are put in column order by insertion sort.
 * A must have sorted rows without duplicates (as every matrix built here has).
 */
export function permuteSymmetric<M extends CsrMatrix | ComplexCsrMatrix>(A: M, perm: Int32Array): M {
  const n = A.n;
  const inv = new Int32Array(n);
  for (let i = 0; i < n; i++) inv[perm[i]!] = i;
  const complex = "re" in A;
  const ar = complex ? (A as ComplexCsrMatrix).re : (A as CsrMatrix).values;
  const ai = complex ? (A as ComplexCsrMatrix).im : null;
  const nnz = A.rowPtr[n]!;
  const rowPtr = new Int32Array(n + 1);
  const colIdx = new Int32Array(nnz);
  const br = new Float64Array(nnz);
  const bi = ai ? new Float64Array(nnz) : null;
  let q = 0;
  for (let i = 0; i < n; i++) {
    const oi = perm[i]!;
    const start = q;
    for (let p = A.rowPtr[oi]!; p < A.rowPtr[oi + 1]!; p++) {
      const j = inv[A.colIdx[p]!]!;
      const vr = ar[p]!;
      const vi = ai ? ai[p]! : 0;
      let t = q++;
      while (t > start && colIdx[t - 1]! > j) {
        colIdx[t] = colIdx[t - 1]!;
        br[t] = br[t - 1]!;
        if (bi) bi[t] = bi[t - 1]!;
        t--;
      }
      colIdx[t] = j;
      br[t] = vr;
      if (bi) bi[t] = vi;
    }
    rowPtr[i + 1] = q;
  }
  return (complex ? { n, rowPtr, colIdx, re: br, im: bi! } : { n, rowPtr, colIdx, values: br }) as M;
}

// ---------------------------------------------------------------------------------
// Incomplete Cholesky IC(0), L·D·Lᵀ form, on the pattern of the lower triangle

export interface Ic0Factor {
  n: number;
  /** Strictly lower part of L (unit diagonal implied), CSR by rows. */
  rowPtr: Int32Array;
  colIdx: Int32Array;
  lr: Float64Array;
  li: Float64Array | null;
  dr: Float64Array;
  di: Float64Array | null;
  /** Diagonal shift α used (M factors A + α·diag(A)); 0 when none was needed. */
  shift: number;
}

function lowerPattern(A: Pattern): { rowPtr: Int32Array; colIdx: Int32Array; src: Int32Array; diag: Int32Array } {
  const n = A.n;
  const rowPtr = new Int32Array(n + 1);
  const diag = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    let c = 0;
    for (let p = A.rowPtr[i]!; p < A.rowPtr[i + 1]!; p++) {
      const j = A.colIdx[p]!;
      if (j < i) c++;
      else if (j === i) diag[i] = p;
    }
    rowPtr[i + 1] = rowPtr[i]! + c;
  }
  const nnz = rowPtr[n]!;
  const colIdx = new Int32Array(nnz);
  const src = new Int32Array(nnz);
  for (let i = 0; i < n; i++) {
    let q = rowPtr[i]!;
    for (let p = A.rowPtr[i]!; p < A.rowPtr[i + 1]!; p++) {
      const j = A.colIdx[p]!;
      if (j < i) {
        colIdx[q] = j;
        src[q++] = p;
      }
    }
  }
  return { rowPtr, colIdx, src, diag };
}

/**
 * IC(0) of a real symmetric matrix: l_ik = (a_ik − Σ_j l_ij·d_j·l_kj)/d_k over the
 * pattern of A only, d_i = a_ii − Σ_k l_ik²·d_k (Saad 2003 §10.3.2). When a pivot is
 * not positive the factorisation is repeated on A + α·diag(A) with α = 1e-3, 1e-2, …
 * (Manteuffel 1980).
 */
export function ic0(A: CsrMatrix): Ic0Factor {
  return incompleteLdlt(A.n, A, A.values, null);
}

/** IC(0) of a complex symmetric matrix (Aᵀ = A, not Hermitian), same recurrences in complex arithmetic. */
export function complexIc0(A: ComplexCsrMatrix): Ic0Factor {
  return incompleteLdlt(A.n, A, A.re, A.im);
}

function incompleteLdlt(n: number, A: Pattern, ar: Float64Array, ai: Float64Array | null): Ic0Factor {
  const pat = lowerPattern(A);
  for (let i = 0; i < n; i++) {
    const p = pat.diag[i]!;
    if (p < 0 || !(ar[p]! > 0)) throw new RangeError(`diagonal entry ${i} is not positive: the matrix is not positive definite`);
  }
  const nnz = pat.colIdx.length;
  const lr = new Float64Array(nnz);
  const li = ai ? new Float64Array(nnz) : null;
  const dr = new Float64Array(n);
  const di = ai ? new Float64Array(n) : null;
  const mark = new Int32Array(n).fill(-1);
  for (const shift of [0, 1e-3, 1e-2, 1e-1, 1]) {
    let ok = true;
    for (let i = 0; i < n && ok; i++) {
      const r0 = pat.rowPtr[i]!;
      const r1 = pat.rowPtr[i + 1]!;
      for (let q = r0; q < r1; q++) {
        mark[pat.colIdx[q]!] = q;
        lr[q] = ar[pat.src[q]!]!;
        if (li) li[q] = ai![pat.src[q]!]!;
      }
      const pd = pat.diag[i]!;
      let sr = ar[pd]! * (1 + shift);
      let si = ai ? ai[pd]! * (1 + shift) : 0;
      for (let q = r0; q < r1; q++) {
        const k = pat.colIdx[q]!;
        let tr = lr[q]!;
        let ti = li ? li[q]! : 0;
        for (let s = pat.rowPtr[k]!; s < pat.rowPtr[k + 1]!; s++) {
          const j = pat.colIdx[s]!;
          const m = mark[j]!;
          if (m < 0) continue;
          if (li) {
            // t −= l_ij·d_j·l_kj (complex)
            const ur = lr[m]! * dr[j]! - li[m]! * di![j]!;
            const ui = lr[m]! * di![j]! + li[m]! * dr[j]!;
            tr -= ur * lr[s]! - ui * li[s]!;
            ti -= ur * li[s]! + ui * lr[s]!;
          } else {
            tr -= lr[m]! * dr[j]! * lr[s]!;
          }
        }
        if (li) {
          // l_ik = t / d_k
          const denr = dr[k]!;
          const deni = di![k]!;
          const dd = denr * denr + deni * deni;
          const vr = (tr * denr + ti * deni) / dd;
          const vi = (ti * denr - tr * deni) / dd;
          lr[q] = vr;
          li[q] = vi;
          // d_i −= l_ik²·d_k
          const sqr = vr * vr - vi * vi;
          const sqi = 2 * vr * vi;
          sr -= sqr * denr - sqi * deni;
          si -= sqr * deni + sqi * denr;
        } else {
          const v = tr / dr[k]!;
          lr[q] = v;
          sr -= v * v * dr[k]!;
        }
      }
      for (let q = r0; q < r1; q++) mark[pat.colIdx[q]!] = -1;
      const scaleRef = ar[pd]!;
      if (li ? !(Math.sqrt(sr * sr + si * si) > 1e-14 * scaleRef) : !(sr > 1e-14 * scaleRef)) ok = false;
      dr[i] = sr;
      if (di) di[i] = si;
    }
    if (ok) return { n, rowPtr: pat.rowPtr, colIdx: pat.colIdx, lr, li, dr, di, shift };
    mark.fill(-1);
  }
  throw new RangeError("incomplete Cholesky broke down even with a diagonal shift: the matrix is not positive definite");
}

/** z = (L·D·Lᵀ)⁻¹·r for a real factor. */
export function ic0Apply(F: Ic0Factor, r: Float64Array, z: Float64Array): void {
  const { n, rowPtr, colIdx, lr, dr } = F;
  for (let i = 0; i < n; i++) {
    let s = r[i]!;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) s -= lr[p]! * z[colIdx[p]!]!;
    z[i] = s;
  }
  for (let i = 0; i < n; i++) z[i] = z[i]! / dr[i]!;
  for (let i = n - 1; i >= 0; i--) {
    const zi = z[i]!;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      const k = colIdx[p]!;
      z[k] = z[k]! - lr[p]! * zi;
    }
  }
}

/** (zr + j·zi) = (L·D·Lᵀ)⁻¹·(rr + j·ri) for a complex factor. */
export function complexIc0Apply(F: Ic0Factor, rr: Float64Array, ri: Float64Array, zr: Float64Array, zi: Float64Array): void {
  const { n, rowPtr, colIdx, lr, dr } = F;
  const li = F.li!;
  const di = F.di!;
  for (let i = 0; i < n; i++) {
    let sr = rr[i]!;
    let si = ri[i]!;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      const k = colIdx[p]!;
      sr -= lr[p]! * zr[k]! - li[p]! * zi[k]!;
      si -= lr[p]! * zi[k]! + li[p]! * zr[k]!;
    }
    zr[i] = sr;
    zi[i] = si;
  }
  for (let i = 0; i < n; i++) {
    const a = zr[i]!;
    const b = zi[i]!;
    const c = dr[i]!;
    const d = di[i]!;
    const dd = c * c + d * d;
    zr[i] = (a * c + b * d) / dd;
    zi[i] = (b * c - a * d) / dd;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ar = zr[i]!;
    const ai = zi[i]!;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      const k = colIdx[p]!;
      zr[k] = zr[k]! - (lr[p]! * ar - li[p]! * ai);
      zi[k] = zi[k]! - (lr[p]! * ai + li[p]! * ar);
    }
  }
}

// ---------------------------------------------------------------------------------
// Krylov solvers

export interface IterativeOptions {
  /** Relative residual target ‖b − A·x‖₂/‖b‖₂ (default 1e-12). */
  tol?: number;
  /** Iteration limit (default max(200, 20·√n)). */
  maxIter?: number;
}

export interface SolveStats {
  iterations: number;
  /** Relative residual from the recurrence at exit. */
  relativeResidual: number;
  /** ‖b − A·x‖₂/‖b‖₂ recomputed from the returned x. */
  trueRelativeResidual: number;
  /**
   * Normwise backward error η = ‖b − A·x‖∞/(‖A‖∞·‖x‖∞ + ‖b‖∞) (Rigal & Gaches 1967;
   * N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §7.1).
   */
  backwardError: number;
  converged: boolean;
  tolerance: number;
  preconditioner: "ic0" | "ic0-shifted";
  shift: number;
  ordering: "rcm";
}

function norm2(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]! * v[i]!;
  return Math.sqrt(s);
}

/**
 * Backward error treated as "solved to rounding": 64 units of double rounding. A
 * stiff network (milliohm bars next to long cables) cannot reach a relative residual
 * of 1e-12 in double precision; it is accepted when η is at rounding level.
 */
export const ROUNDING_LEVEL = 64 * Number.EPSILON;

function normInf(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]!));
  return m;
}

function complexNormInf(a: Float64Array, b: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.sqrt(a[i]! * a[i]! + b[i]! * b[i]!));
  return m;
}

function csrNormInf(rowPtr: Int32Array, re: Float64Array, im: Float64Array | null): number {
  let m = 0;
  for (let i = 0; i + 1 < rowPtr.length; i++) {
    let s = 0;
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) s += im ? Math.sqrt(re[p]! * re[p]! + im[p]! * im[p]!) : Math.abs(re[p]!);
    m = Math.max(m, s);
  }
  return m;
}

function defaultMaxIter(n: number): number {
  return Math.max(200, Math.ceil(20 * Math.sqrt(n)));
}

/** Restarts from the true residual b − A·x when the recurrence residual has drifted from it. */
const MAX_RESTARTS = 4;

/**
 * Preconditioned conjugate gradients (Saad 2003, Algorithm 9.1) with an IC(0) factor.
 * When the recurrence says "converged" but the true residual b − A·x is still above
 * tol, CG is restarted from the true residual (residual replacement), up to 4 times.
 */
export function pcg(A: CsrMatrix, b: Float64Array, M: Ic0Factor, opts: IterativeOptions = {}): { x: Float64Array; stats: SolveStats } {
  const n = A.n;
  const tol = opts.tol ?? DEFAULT_TOLERANCE;
  const maxIter = opts.maxIter ?? defaultMaxIter(n);
  const x = new Float64Array(n);
  const r = new Float64Array(n);
  const z = new Float64Array(n);
  const p = new Float64Array(n);
  const q = new Float64Array(n);
  const bnorm = norm2(b);
  const base = { tolerance: tol, preconditioner: M.shift > 0 ? ("ic0-shifted" as const) : ("ic0" as const), shift: M.shift, ordering: "rcm" as const };
  if (bnorm === 0) return { x, stats: { iterations: 0, relativeResidual: 0, trueRelativeResidual: 0, backwardError: 0, converged: true, ...base } };
  let it = 0;
  let rel = 1;
  let trueRel = 1;
  let backward = 1;
  const aInf = csrNormInf(A.rowPtr, A.values, null);
  const bInf = normInf(b);
  for (let restart = 0; restart <= MAX_RESTARTS; restart++) {
    csrMulVec(A, x, q);
    for (let i = 0; i < n; i++) r[i] = b[i]! - q[i]!;
    trueRel = norm2(r) / bnorm;
    backward = normInf(r) / (aInf * normInf(x) + bInf);
    if (trueRel <= tol || backward <= ROUNDING_LEVEL || it >= maxIter) break;
    ic0Apply(M, r, z);
    p.set(z);
    let rz = 0;
    for (let i = 0; i < n; i++) rz += r[i]! * z[i]!;
    while (it < maxIter) {
      it++;
      csrMulVec(A, p, q);
      let pq = 0;
      for (let i = 0; i < n; i++) pq += p[i]! * q[i]!;
      if (!(pq > 0)) break;
      const alpha = rz / pq;
      let rr = 0;
      for (let i = 0; i < n; i++) {
        x[i] = x[i]! + alpha * p[i]!;
        const ri = r[i]! - alpha * q[i]!;
        r[i] = ri;
        rr += ri * ri;
      }
      rel = Math.sqrt(rr) / bnorm;
      if (rel <= tol) break;
      ic0Apply(M, r, z);
      let rzNew = 0;
      for (let i = 0; i < n; i++) rzNew += r[i]! * z[i]!;
      const beta = rzNew / rz;
      rz = rzNew;
      for (let i = 0; i < n; i++) p[i] = z[i]! + beta * p[i]!;
    }
  }
  return { x, stats: { iterations: it, relativeResidual: rel, trueRelativeResidual: trueRel, backwardError: backward, converged: trueRel <= 10 * tol || backward <= ROUNDING_LEVEL, ...base } };
}

/**
 * COCG for complex symmetric A (van der Vorst & Melissen 1990): CG with the bilinear
 * form xᵀy (no conjugation) in place of the inner product; ‖·‖₂ for the stopping test.
 * Same residual-replacement restarts as `pcg`.
 */
export function cocg(
  A: ComplexCsrMatrix,
  br: Float64Array,
  bi: Float64Array,
  M: Ic0Factor,
  opts: IterativeOptions = {},
): { xr: Float64Array; xi: Float64Array; stats: SolveStats } {
  const n = A.n;
  const tol = opts.tol ?? DEFAULT_TOLERANCE;
  const maxIter = opts.maxIter ?? defaultMaxIter(n);
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  const rr = new Float64Array(n);
  const ri = new Float64Array(n);
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  const pr = new Float64Array(n);
  const pi = new Float64Array(n);
  const qr = new Float64Array(n);
  const qi = new Float64Array(n);
  const bnorm = Math.hypot(norm2(br), norm2(bi));
  const base = { tolerance: tol, preconditioner: M.shift > 0 ? ("ic0-shifted" as const) : ("ic0" as const), shift: M.shift, ordering: "rcm" as const };
  if (bnorm === 0) return { xr, xi, stats: { iterations: 0, relativeResidual: 0, trueRelativeResidual: 0, backwardError: 0, converged: true, ...base } };
  let it = 0;
  let rel = 1;
  let trueRel = 1;
  let backward = 1;
  const aInf = csrNormInf(A.rowPtr, A.re, A.im);
  const bInf = complexNormInf(br, bi);
  for (let restart = 0; restart <= MAX_RESTARTS; restart++) {
    complexCsrMulVec(A, xr, xi, qr, qi);
    let tr = 0;
    for (let i = 0; i < n; i++) {
      rr[i] = br[i]! - qr[i]!;
      ri[i] = bi[i]! - qi[i]!;
      tr += rr[i]! * rr[i]! + ri[i]! * ri[i]!;
    }
    trueRel = Math.sqrt(tr) / bnorm;
    backward = complexNormInf(rr, ri) / (aInf * complexNormInf(xr, xi) + bInf);
    if (trueRel <= tol || backward <= ROUNDING_LEVEL || it >= maxIter) break;
    complexIc0Apply(M, rr, ri, zr, zi);
    pr.set(zr);
    pi.set(zi);
    // ρ = rᵀz (unconjugated)
    let rhoR = 0;
    let rhoI = 0;
    for (let i = 0; i < n; i++) {
      rhoR += rr[i]! * zr[i]! - ri[i]! * zi[i]!;
      rhoI += rr[i]! * zi[i]! + ri[i]! * zr[i]!;
    }
    while (it < maxIter) {
      it++;
      complexCsrMulVec(A, pr, pi, qr, qi);
      let sR = 0;
      let sI = 0;
      for (let i = 0; i < n; i++) {
        sR += pr[i]! * qr[i]! - pi[i]! * qi[i]!;
        sI += pr[i]! * qi[i]! + pi[i]! * qr[i]!;
      }
      const ss = sR * sR + sI * sI;
      if (!(ss > 0)) break;
      // α = ρ / (pᵀq)
      const aR = (rhoR * sR + rhoI * sI) / ss;
      const aI = (rhoI * sR - rhoR * sI) / ss;
      let res = 0;
      for (let i = 0; i < n; i++) {
        const pR = pr[i]!;
        const pI = pi[i]!;
        xr[i] = xr[i]! + aR * pR - aI * pI;
        xi[i] = xi[i]! + aR * pI + aI * pR;
        const qR = qr[i]!;
        const qI = qi[i]!;
        const nr = rr[i]! - (aR * qR - aI * qI);
        const ni = ri[i]! - (aR * qI + aI * qR);
        rr[i] = nr;
        ri[i] = ni;
        res += nr * nr + ni * ni;
      }
      rel = Math.sqrt(res) / bnorm;
      if (rel <= tol) break;
      complexIc0Apply(M, rr, ri, zr, zi);
      let nR = 0;
      let nI = 0;
      for (let i = 0; i < n; i++) {
        nR += rr[i]! * zr[i]! - ri[i]! * zi[i]!;
        nI += rr[i]! * zi[i]! + ri[i]! * zr[i]!;
      }
      const rho2 = rhoR * rhoR + rhoI * rhoI;
      if (!(rho2 > 0)) break;
      const bR = (nR * rhoR + nI * rhoI) / rho2;
      const bI = (nI * rhoR - nR * rhoI) / rho2;
      rhoR = nR;
      rhoI = nI;
      for (let i = 0; i < n; i++) {
        const pR = pr[i]!;
        const pI = pi[i]!;
        pr[i] = zr[i]! + bR * pR - bI * pI;
        pi[i] = zi[i]! + bR * pI + bI * pR;
      }
    }
  }
  return { xr, xi, stats: { iterations: it, relativeResidual: rel, trueRelativeResidual: trueRel, backwardError: backward, converged: trueRel <= 10 * tol || backward <= ROUNDING_LEVEL, ...base } };
}

// ---------------------------------------------------------------------------------
// Front ends: order, factor, iterate, restore the original numbering

function maxAbs(a: Float64Array, b: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]!), Math.abs(b[i]!));
  return m;
}

/** Solves A·x = b for real symmetric positive definite A: RCM → IC(0) → PCG. */
export function solveSpd(A: CsrMatrix, b: Float64Array, opts: IterativeOptions = {}): { x: Float64Array; stats: SolveStats } {
  if (b.length !== A.n) throw new RangeError(`right-hand side has ${b.length} entries, matrix order is ${A.n}`);
  const perm = rcmOrdering(A);
  const B = permuteSymmetric(A, perm);
  // Right-hand side scaled to max |b| = 1 so tiny or huge data cannot under/overflow ‖b‖².
  const scale = maxAbs(b, b);
  const pb = new Float64Array(A.n);
  if (scale > 0) for (let i = 0; i < A.n; i++) pb[i] = b[perm[i]!]! / scale;
  const M = ic0(B);
  const { x: px, stats } = pcg(B, pb, M, opts);
  const x = new Float64Array(A.n);
  for (let i = 0; i < A.n; i++) x[perm[i]!] = px[i]! * scale;
  return { x, stats };
}

/** Solves A·x = b for complex symmetric A with a positive definite real part: RCM → complex IC(0) → COCG. */
export function solveComplexSymmetric(
  A: ComplexCsrMatrix,
  br: Float64Array,
  bi: Float64Array,
  opts: IterativeOptions = {},
): { xr: Float64Array; xi: Float64Array; stats: SolveStats } {
  if (br.length !== A.n || bi.length !== A.n) throw new RangeError(`right-hand side has ${br.length} entries, matrix order is ${A.n}`);
  const perm = rcmOrdering(A);
  const B = permuteSymmetric(A, perm);
  const scale = maxAbs(br, bi);
  const pr = new Float64Array(A.n);
  const pi = new Float64Array(A.n);
  if (scale > 0)
    for (let i = 0; i < A.n; i++) {
      pr[i] = br[perm[i]!]! / scale;
      pi[i] = bi[perm[i]!]! / scale;
    }
  const M = complexIc0(B);
  const r = cocg(B, pr, pi, M, opts);
  const xr = new Float64Array(A.n);
  const xi = new Float64Array(A.n);
  for (let i = 0; i < A.n; i++) {
    xr[perm[i]!] = r.xr[i]! * scale;
    xi[perm[i]!] = r.xi[i]! * scale;
  }
  return { xr, xi, stats: r.stats };
}
