import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { complex, lusolve, matrix } from "mathjs";
import {
  TripletBuilder,
  csrFromTriplets,
  csrMulVec,
  csrToDense,
  permuteSymmetric,
  rcmOrdering,
  solveComplexSymmetric,
  solveSpd,
  type CsrMatrix,
} from "../../lib/engine/sparse";

/** Small deterministic generator (mulberry32, common practice for reproducible test data). */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Random connected weighted graph (spanning tree + extra edges) as edge list. */
function randomGraph(n: number, extra: number, r: () => number): [number, number, number][] {
  const edges: [number, number, number][] = [];
  for (let i = 1; i < n; i++) edges.push([i, Math.floor(r() * i), 0.1 + 10 * r()]);
  for (let e = 0; e < extra; e++) {
    const a = Math.floor(r() * n);
    const b = Math.floor(r() * n);
    if (a !== b) edges.push([a, b, 0.1 + 10 * r()]);
  }
  return edges;
}

/** Grounded weighted Laplacian: an SPD M-matrix (every node tied to ground by g_i ≥ 0, at least one > 0). */
function groundedLaplacian(n: number, edges: [number, number, number][], ground: number[]): CsrMatrix {
  const b = new TripletBuilder(n);
  for (const [i, j, g] of edges) {
    b.add(i, i, g);
    b.add(j, j, g);
    b.add(i, j, -g);
    b.add(j, i, -g);
  }
  ground.forEach((g, i) => b.add(i, i, g));
  return b.toCsr();
}

function denseSolve(A: number[][], b: number[]): number[] {
  const x = lusolve(A, b) as unknown as number[][];
  return x.map((row) => row[0]!);
}

function maxRelDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let scale = 0;
  for (let i = 0; i < b.length; i++) scale = Math.max(scale, Math.abs(b[i]!));
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i]! - b[i]!));
  return d / scale;
}

describe("CSR from triplets", () => {
  it("sums duplicates and sorts columns within rows", () => {
    // Hand example: entries (0,1)=2 twice and (1,0)=5 → dense [[1,4],[5,0]] after summing.
    const A = csrFromTriplets(2, [0, 0, 1, 0], [1, 0, 0, 1], [2, 1, 5, 2]);
    expect(Array.from(A.rowPtr)).toEqual([0, 2, 3]);
    expect(Array.from(A.colIdx)).toEqual([0, 1, 0]);
    expect(Array.from(A.values)).toEqual([1, 4, 5]);
    expect(csrToDense(A)).toEqual([
      [1, 4],
      [5, 0],
    ]);
  });

  it("rejects entries outside the matrix", () => {
    expect(() => csrFromTriplets(2, [2], [0], [1])).toThrow(/outside/);
  });

  it("matrix-vector product equals the dense product", () => {
    const A = csrFromTriplets(3, [0, 1, 2, 2, 0], [0, 1, 2, 0, 2], [2, 3, 4, 1, 1]);
    const y = new Float64Array(3);
    csrMulVec(A, Float64Array.from([1, 2, 3]), y);
    // Dense: [[2,0,1],[0,3,0],[1,0,4]]·[1,2,3] = [5, 6, 13]
    expect(Array.from(y)).toEqual([5, 6, 13]);
  });
});

describe("reverse Cuthill–McKee", () => {
  it("returns a permutation and turns a shuffled path graph into a band of width 1", () => {
    // A path graph has bandwidth 1 in its natural order; RCM must recover a band of 1
    // (George & Liu 1981 §4.3: CM on a path from a peripheral node numbers it in order).
    const n = 40;
    const r = rng(7);
    const label = Array.from({ length: n }, (_, i) => i).sort(() => r() - 0.5);
    const edges: [number, number, number][] = [];
    for (let i = 1; i < n; i++) edges.push([label[i - 1]!, label[i]!, 1]);
    const A = groundedLaplacian(n, edges, [1]);
    const perm = rcmOrdering(A);
    expect(Array.from(perm).sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
    const B = permuteSymmetric(A, perm);
    let band = 0;
    for (let i = 0; i < n; i++) for (let p = B.rowPtr[i]!; p < B.rowPtr[i + 1]!; p++) band = Math.max(band, Math.abs(B.colIdx[p]! - i));
    expect(band).toBe(1);
  });

  it("P·A·Pᵀ written directly into CSR equals the dense permutation, rows sorted (real and complex)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 1, max: 30 }), fc.integer({ min: 0, max: 40 }), (seed, n, extra) => {
        const r = rng(seed);
        const b = new TripletBuilder(n);
        for (let i = 0; i < n; i++) b.add(i, i, 1 + r(), r());
        for (const [i, j, w] of randomGraph(n, extra, r)) {
          b.add(i, j, -w, -w / 2);
          b.add(j, i, -w, -w / 2);
        }
        const A = b.toComplexCsr();
        const perm = Int32Array.from(Array.from({ length: n }, (_, i) => i).sort(() => r() - 0.5));
        const B = permuteSymmetric(A, perm);
        const dense = (M: typeof A, part: "re" | "im") => {
          const d = Array.from({ length: n }, () => new Array<number>(n).fill(0));
          for (let i = 0; i < n; i++) for (let p = M.rowPtr[i]!; p < M.rowPtr[i + 1]!; p++) d[i]![M.colIdx[p]!] = M[part][p]!;
          return d;
        };
        for (const part of ["re", "im"] as const) {
          const a = dense(A, part);
          const got = dense(B, part);
          for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(got[i]![j]).toBe(a[perm[i]!]![perm[j]!]);
        }
        for (let i = 0; i < n; i++) for (let p = B.rowPtr[i]! + 1; p < B.rowPtr[i + 1]!; p++) expect(B.colIdx[p]!).toBeGreaterThan(B.colIdx[p - 1]!);
        expect(B.rowPtr[n]).toBe(A.rowPtr[n]);
        // the real form carries the same pattern and values
        const Br = permuteSymmetric({ n, rowPtr: A.rowPtr, colIdx: A.colIdx, values: A.re }, perm);
        expect(Array.from(Br.values)).toEqual(Array.from(B.re));
      }),
      { numRuns: 60 },
    );
  });
});

describe("real SPD solve (RCM + IC(0) + PCG) against mathjs dense lusolve", () => {
  it("random grounded Laplacians, trees and meshes", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 2, max: 40 }), fc.integer({ min: 0, max: 30 }), (seed, n, extra) => {
        const r = rng(seed);
        const ground = Array.from({ length: n }, () => (r() < 0.2 ? r() : 0));
        ground[0] = 1 + r();
        const A = groundedLaplacian(n, randomGraph(n, extra, r), ground);
        const b = Float64Array.from({ length: n }, () => r() * 2 - 1);
        const { x, stats } = solveSpd(A, b);
        const ref = denseSolve(csrToDense(A), Array.from(b));
        expect(stats.converged).toBe(true);
        expect(stats.trueRelativeResidual).toBeLessThanOrEqual(1e-11);
        // Tolerance: relative to max |x|; dense LU and PCG agree to ~cond·1e-12.
        expect(maxRelDiff(x, ref)).toBeLessThan(1e-8);
      }),
      { numRuns: 40 },
    );
  });

  it("random SPD matrices with mixed-sign off-diagonals (not M-matrices)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 2, max: 30 }), (seed, n) => {
        const r = rng(seed);
        // Symmetric, strictly diagonally dominant with positive diagonal ⇒ SPD (Gershgorin).
        const b = new TripletBuilder(n);
        const rowSum = new Float64Array(n);
        for (let e = 0; e < 3 * n; e++) {
          const i = Math.floor(r() * n);
          const j = Math.floor(r() * n);
          if (i === j) continue;
          const v = r() * 2 - 1;
          b.add(i, j, v);
          b.add(j, i, v);
          rowSum[i] = rowSum[i]! + Math.abs(v);
          rowSum[j] = rowSum[j]! + Math.abs(v);
        }
        for (let i = 0; i < n; i++) b.add(i, i, rowSum[i]! + 0.01 + r());
        const A = b.toCsr();
        const rhs = Float64Array.from({ length: n }, () => r() * 2 - 1);
        const { x, stats } = solveSpd(A, rhs);
        expect(stats.converged).toBe(true);
        expect(maxRelDiff(x, denseSolve(csrToDense(A), Array.from(rhs)))).toBeLessThan(1e-8);
      }),
      { numRuns: 30 },
    );
  });

  it("a tree (radial network) is solved in one PCG step: IC(0) is the exact factor under RCM", () => {
    const n = 500;
    const r = rng(11);
    const ground = new Array<number>(n).fill(0);
    ground[0] = 5;
    const A = groundedLaplacian(n, randomGraph(n, 0, r), ground);
    const b = Float64Array.from({ length: n }, () => -r());
    const { stats } = solveSpd(A, b);
    expect(stats.iterations).toBe(1);
    expect(stats.shift).toBe(0);
    expect(stats.trueRelativeResidual).toBeLessThan(1e-12);
  });

  it("zero right-hand side gives zero, and a non-positive diagonal is refused", () => {
    const A = csrFromTriplets(2, [0, 1], [0, 1], [2, 3]);
    expect(Array.from(solveSpd(A, new Float64Array(2)).x)).toEqual([0, 0]);
    const Bad = csrFromTriplets(2, [0, 1], [0, 1], [2, -3]);
    expect(() => solveSpd(Bad, Float64Array.from([1, 1]))).toThrow(/not positive/);
  });
});

describe("complex symmetric solve (RCM + complex IC(0) + COCG) against mathjs dense lusolve", () => {
  it("random admittance networks Y = 1/(R + jX)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 2, max: 25 }), fc.integer({ min: 0, max: 20 }), (seed, n, extra) => {
        const r = rng(seed);
        const b = new TripletBuilder(n);
        const addY = (i: number, j: number | null, R: number, X: number) => {
          const d = R * R + X * X;
          const yr = R / d;
          const yi = -X / d;
          b.add(i, i, yr, yi);
          if (j !== null) {
            b.add(j, j, yr, yi);
            b.add(i, j, -yr, -yi);
            b.add(j, i, -yr, -yi);
          }
        };
        for (const [i, j] of randomGraph(n, extra, r)) addY(i, j, 0.01 + r(), r() * 0.05);
        addY(0, null, 0.01 + r(), r() * 0.05);
        const A = b.toComplexCsr();
        const br = Float64Array.from({ length: n }, () => r() - 0.5);
        const bi = Float64Array.from({ length: n }, () => r() - 0.5);
        const { xr, xi, stats } = solveComplexSymmetric(A, br, bi);
        expect(stats.converged).toBe(true);
        const dense = Array.from({ length: n }, () => Array.from({ length: n }, () => complex(0, 0)));
        for (let i = 0; i < n; i++)
          for (let p = A.rowPtr[i]!; p < A.rowPtr[i + 1]!; p++) dense[i]![A.colIdx[p]!] = complex(A.re[p]!, A.im[p]!);
        const ref = lusolve(matrix(dense as never), matrix(Array.from(br, (v, i) => complex(v, bi[i]!)) as never)) as unknown as {
          toArray(): { re: number; im: number }[][];
        };
        const refArr = ref.toArray().map((row) => row[0]!);
        let scale = 0;
        let diff = 0;
        for (let i = 0; i < n; i++) {
          scale = Math.max(scale, Math.hypot(refArr[i]!.re, refArr[i]!.im));
          diff = Math.max(diff, Math.hypot(xr[i]! - refArr[i]!.re, xi[i]! - refArr[i]!.im));
        }
        expect(diff / scale).toBeLessThan(1e-8);
      }),
      { numRuns: 30 },
    );
  });
});
