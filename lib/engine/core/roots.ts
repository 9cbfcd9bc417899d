/**
 * Brent's method: bracketed root finding that combines bisection, secant and inverse
 * quadratic interpolation and always keeps the root bracketed.
 * R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall 1973, ch. 4
 * (the zero procedure); also Press et al., Numerical Recipes, 3rd ed., §9.3.
 */
export interface BrentOptions {
  /** Absolute tolerance on x. */
  xtol?: number;
  /** Safety bound on iterations; the bracket guarantees convergence long before it. */
  maxIter?: number;
}

export class NoBracketError extends Error {
  constructor(
    public readonly fa: number,
    public readonly fb: number,
  ) {
    super(`root not bracketed: f(a)=${fa}, f(b)=${fb}`);
    this.name = "NoBracketError";
  }
}

export function brent(f: (x: number) => number, a: number, b: number, opts: BrentOptions = {}): number {
  const xtol = opts.xtol ?? 1e-10;
  const maxIter = opts.maxIter ?? 200;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(Number.isFinite(fa) && Number.isFinite(fb)) || Math.sign(fa) === Math.sign(fb)) throw new NoBracketError(fa, fb);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < maxIter; i++) {
    if (Math.sign(fb) === Math.sign(fc)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let qq: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        qq = 1 - s;
      } else {
        const q0 = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * q0 * (q0 - r) - (b - a) * (r - 1));
        qq = (q0 - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) qq = -qq;
      else p = -p;
      if (2 * p < Math.min(3 * m * qq - Math.abs(tol * qq), Math.abs(e * qq))) {
        e = d;
        d = p / qq;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}

/**
 * Expands [a, b] outward (b grows geometrically) until f changes sign, then solves.
 * For monotone physical balances where only a lower bound is known.
 */
export function brentExpanding(f: (x: number) => number, a: number, b: number, opts: BrentOptions & { maxExpand?: number } = {}): number {
  let fb = f(b);
  const fa = f(a);
  let hi = b;
  for (let i = 0; i < (opts.maxExpand ?? 60) && Math.sign(fa) === Math.sign(fb); i++) {
    hi = a + (hi - a) * 2;
    fb = f(hi);
  }
  return brent(f, a, hi, opts);
}
