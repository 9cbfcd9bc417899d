/**
 * Rounding of presented values with decimal.js (round half away from zero on the
 * decimal representation, so 2.675 → "2.68", not the binary 2.67).
 */
import Decimal from "decimal.js";

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP, toExpNeg: -7, toExpPos: 21 });

/** x to n significant figures, as a string without exponent for ordinary magnitudes ("0.0754", "1200"). */
export function sig(x: number, n: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (!(Number.isInteger(n) && n >= 1 && n <= 20)) throw new RangeError(`significant figures must be 1…20, got ${n}`);
  if (x === 0) return new D(0).toFixed(n - 1);
  const d = new D(String(x)).toSignificantDigits(n, Decimal.ROUND_HALF_UP);
  const exp = d.e; // exponent of the leading digit
  const decimals = Math.max(0, n - 1 - exp);
  if (exp < -7 || exp >= 21) return d.toExponential(n - 1);
  return d.toFixed(decimals);
}

/** x with d decimals ("12.30"). */
export function fixed(x: number, d: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (!(Number.isInteger(d) && d >= 0 && d <= 20)) throw new RangeError(`decimals must be 0…20, got ${d}`);
  const out = new D(String(x)).toFixed(d, Decimal.ROUND_HALF_UP);
  return out === `-${new D(0).toFixed(d)}` ? out.slice(1) : out;
}

/** Rounded number (not string) to n significant figures. */
export function roundSig(x: number, n: number): number {
  return Number(sig(x, n));
}
