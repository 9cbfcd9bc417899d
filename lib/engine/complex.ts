/**
 * Small complex-number helpers for phasor work. Values are plain {re, im} objects
 * for clarity outside hot loops; the sparse solvers keep real and imaginary parts in
 * separate Float64Arrays and do the arithmetic inline, so nothing here allocates
 * inside an iteration.
 */
export interface Complex {
  re: number;
  im: number;
}

export const ZERO: Complex = Object.freeze({ re: 0, im: 0 });

export function c(re: number, im = 0): Complex {
  return { re, im };
}

export function add(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

export function sub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

export function mul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

export function scale(a: Complex, k: number): Complex {
  return { re: a.re * k, im: a.im * k };
}

/** a / b by Smith's method, which avoids overflow of |b|² (R. L. Smith, CACM 5(8) 1962). */
export function div(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

export function inv(b: Complex): Complex {
  return div({ re: 1, im: 0 }, b);
}

export function conj(a: Complex): Complex {
  return { re: a.re, im: -a.im };
}

export function abs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/** Argument in degrees, (−180, 180]. */
export function argDeg(a: Complex): number {
  return (Math.atan2(a.im, a.re) * 180) / Math.PI;
}

export function polar(magnitude: number, angle_deg: number): Complex {
  const t = (angle_deg * Math.PI) / 180;
  return { re: magnitude * Math.cos(t), im: magnitude * Math.sin(t) };
}
