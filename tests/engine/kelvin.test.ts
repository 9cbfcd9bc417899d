import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  kelvin, kelvinArgument, kelvinAsymptotic, kelvinSeries, KELVIN_SERIES_LIMIT, roundInternalReactanceRatioExact, roundSkinRatioExact,
} from "../../lib/engine/kelvin";
import { iecSkinFactor } from "../../lib/engine/resistance";

describe("Kelvin functions", () => {
  // Abramowitz & Stegun, Handbook of Mathematical Functions, Table 9.12 (ber, bei to 5+ decimals).
  // x = 1 and 2 as quoted in the A&S table; x = 5 and the derivatives at 1 are from memory of the same table.
  it.each([
    [1, 0.98438, 0.24957],
    [2, 0.75173, 0.97229],
    [5, -6.23008, 0.11603],
  ])("ber(%s), bei(%s) (A&S Table 9.12)", (x, ber, bei) => {
    const k = kelvin(x);
    expect(k.ber).toBeCloseTo(ber, 5);
    expect(k.bei).toBeCloseTo(bei, 5);
  });

  it("derivatives at x = 1: ber′ = −0.062446, bei′ = 0.497397 (A&S Table 9.12, from memory)", () => {
    const k = kelvin(1);
    expect(k.berp).toBeCloseTo(-0.062446, 5);
    expect(k.beip).toBeCloseTo(0.497397, 5);
  });

  it("derivatives agree with central differences of the series (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.2, max: 15, noNaN: true }), (x) => {
        const h = 1e-5;
        const a = kelvin(x + h), b = kelvin(x - h), k = kelvin(x);
        const scale = 1 + Math.abs(k.ber) + Math.abs(k.bei);
        return Math.abs((a.ber - b.ber) / (2 * h) - k.berp) < 1e-6 * scale && Math.abs((a.bei - b.bei) / (2 * h) - k.beip) < 1e-6 * scale;
      }),
    );
  });

  it("series and asymptotic expansion agree in the overlap 10 ≤ x ≤ 20 (within 1e-6 relative; 1e-9 from x = 15)", () => {
    for (let x = 10; x <= 20; x += 0.5) {
      const s = kelvinSeries(x), a = kelvinAsymptotic(x);
      const tol = x >= 15 ? 1e-9 : 1e-6;
      for (const key of ["ber", "bei", "berp", "beip"] as const) {
        const scale = Math.hypot(s.ber, s.bei, s.berp, s.beip);
        expect(Math.abs(s[key] - a[key]) / scale).toBeLessThan(tol);
      }
    }
    expect(KELVIN_SERIES_LIMIT).toBe(20);
  });
});

describe("exact skin effect of a round conductor", () => {
  it("low-frequency limits: Rac/Rdc − 1 → x⁴/192 and X_int/Rdc → x²/8 (internal inductance μ0/8π; Ramo, Whinnery & Van Duzer §5.13)", () => {
    for (const x of [0.05, 0.1, 0.2]) {
      expect((roundSkinRatioExact(x) - 1) / (x ** 4 / 192)).toBeCloseTo(1, 3);
      expect(roundInternalReactanceRatioExact(x) / (x * x / 8)).toBeCloseTo(1, 3);
    }
  });

  it("high-frequency limit: Rac/Rdc → x/(2√2) + 1/4 (current in a skin depth; Ramo, Whinnery & Van Duzer §5.13)", () => {
    const x = 40;
    expect(Math.abs(roundSkinRatioExact(x) - (x / (2 * Math.SQRT2) + 0.25)) / roundSkinRatioExact(x)).toBeLessThan(2e-3);
  });

  it("Kelvin argument equals IEC 60287-1-1 x_s (k_s = 1): 2·sqrt(2)·r/δ relation, copper at 50 Hz δ ≈ 9.3 mm (common practice)", () => {
    const rho = 1.7241e-8;
    const delta = Math.sqrt(rho / (Math.PI * 50 * 4e-7 * Math.PI));
    expect(delta * 1000).toBeCloseTo(9.35, 1);
    expect(kelvinArgument(0.01, 50, rho)).toBeCloseTo((Math.SQRT2 * 0.01) / delta, 12);
  });

  // IEC 60287-1-1:2006 §2.1.2 states y_s formulas "accurate" for x_s ≤ 2.8 (and the further ranges);
  // observed agreement with the exact solution (scan step 0.01): |Δ(Rac/Rdc)| ≤ 0.00134 for x_s ≤ 2.8
  // (worst at 2.8), ≤ 0.0066 for 2.8 < x_s ≤ 3.8 and ≤ 0.6 % relative for 3.8 < x_s ≤ 10.
  it("IEC 60287-1-1 y_s against the exact Kelvin-function solution", () => {
    let worst = 0;
    for (let x = 0.1; x <= 2.8 + 1e-9; x += 0.05) worst = Math.max(worst, Math.abs(1 + iecSkinFactor(x) - roundSkinRatioExact(x)));
    expect(worst).toBeLessThan(0.0015);
    expect(worst).toBeGreaterThan(0.0005); // the correlation is an approximation, not the exact curve
    for (let x = 2.85; x <= 3.8; x += 0.05) expect(Math.abs(1 + iecSkinFactor(x) - roundSkinRatioExact(x))).toBeLessThan(0.007);
    for (let x = 3.85; x <= 10; x += 0.05) expect(Math.abs(1 + iecSkinFactor(x) - roundSkinRatioExact(x)) / roundSkinRatioExact(x)).toBeLessThan(0.006);
  });

  it("rejects negative arguments", () => {
    expect(() => kelvin(-1)).toThrow(/x must be/);
  });
});
