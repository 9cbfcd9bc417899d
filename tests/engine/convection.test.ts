import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { airProperties, filmTemperatureK, pressureAtAltitude, P_SEA_LEVEL } from "../../lib/engine/air";
import {
  hFromNu,
  nuHorizontalCylinder,
  nuPlateDown,
  nuPlateUp,
  nuVerticalChannel,
  nuVerticalPlate,
  nuVerticalPlateLaminar,
  rangeWarning,
  rayleigh,
} from "../../lib/engine/convection";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("air properties (Incropera 6th ed. Table A.4, interpolated)", () => {
  // Independent table: Çengel & Ghajar, Heat and Mass Transfer, Table A-15 "Properties of
  // air at 1 atm pressure". The two books differ by up to ~2.6 % in k and ~3.1 % in Pr
  // (Çengel's Pr is higher); tolerance 3 % on k and ν, 3.5 % on Pr.
  it.each([
    // θ °C, k W/(m·K), ν m²/s, Pr  — Çengel Table A-15
    [20, 0.02514, 1.516e-5, 0.7309],
    [50, 0.02735, 1.798e-5, 0.7228],
    [100, 0.03095, 2.306e-5, 0.7111],
  ])("at %d °C agrees with Çengel Table A-15 within 3 %% (Pr 3.5 %%)", (theta, k, nu, Pr) => {
    const a = airProperties(theta + 273.15);
    expect(rel(a.k, k)).toBeLessThan(0.03);
    expect(rel(a.nu, nu)).toBeLessThan(0.03);
    expect(rel(a.Pr, Pr)).toBeLessThan(0.035);
    expect(a.inTableRange).toBe(true);
  });

  it("viscosity follows Sutherland's law within 1 % (White, Viscous Fluid Flow, 3rd ed. eq. 1-36: μ0 = 1.716e-5, T0 = 273 K, S = 111 K)", () => {
    for (const T of [260, 290, 330, 375, 420, 480]) {
      const suth = 1.716e-5 * Math.pow(T / 273, 1.5) * (273 + 111) / (T + 111);
      expect(rel(airProperties(T).mu, suth)).toBeLessThan(0.01);
    }
  });

  it("interpolated rows stay self-consistent: Pr = ν/α and ν = μ/ρ within 1.5 % (definitions; linear interpolation of ρ ∝ 1/T bends by < 1.5 % between rows)", () => {
    fc.assert(
      fc.property(fc.double({ min: 250, max: 500, noNaN: true }), (T) => {
        const a = airProperties(T);
        expect(rel(a.Pr, a.nu / a.alpha)).toBeLessThan(0.015);
        expect(rel(a.nu, a.mu / a.rho)).toBeLessThan(0.015);
      }),
      { numRuns: 60 },
    );
  });

  it("flags film temperatures outside 250–500 K", () => {
    expect(airProperties(520).inTableRange).toBe(false);
    expect(airProperties(240).inTableRange).toBe(false);
  });

  it("film temperature is the mean of surface and ambient, in K (Incropera eq. 7.2)", () => {
    expect(filmTemperatureK(65, 35)).toBeCloseTo(323.15, 10);
  });

  it.each([
    // ISO 2533:1975 standard atmosphere, pressure at geopotential altitude (from memory, to 4 digits)
    [1000, 89875],
    [2000, 79495],
    [5000, 54020],
  ])("ISA pressure at %d m ≈ %d Pa within 0.2 %%", (h, p) => {
    expect(rel(pressureAtAltitude(h), p)).toBeLessThan(0.002);
  });

  it("ν and α scale with 1/p, k and Pr do not (ideal gas, Incropera §9.1)", () => {
    const a0 = airProperties(320);
    const a1 = airProperties(320, P_SEA_LEVEL / 2);
    expect(a1.nu / a0.nu).toBeCloseTo(2, 12);
    expect(a1.alpha / a0.alpha).toBeCloseTo(2, 12);
    expect(a1.k).toBe(a0.k);
    expect(a1.Pr).toBe(a0.Pr);
  });
});

describe("natural convection correlations", () => {
  it("Incropera 6th ed. Example 9.2 (glass fireplace door 0.71 m × 1.02 m, 232 °C in 23 °C air): Ra 1.813e9, Nu 147, h 7.0, q 1060 W", () => {
    const air = airProperties(400); // T_f = 400 K in the example
    expect(air.beta).toBeCloseTo(0.0025, 12);
    const Ra = rayleigh(232 - 23, 0.71, air, 9.8); // the example uses g = 9.8 m/s²
    expect(rel(Ra, 1.813e9)).toBeLessThan(0.005);
    const Nu = nuVerticalPlate(Ra, air.Pr);
    expect(rel(Nu, 147)).toBeLessThan(0.01);
    const h = hFromNu(Nu, air.k, 0.71);
    expect(rel(h, 7.0)).toBeLessThan(0.01);
    expect(rel(h * 1.02 * 0.71 * (232 - 23), 1060)).toBeLessThan(0.01);
  });

  it("Incropera 6th ed. Example 9.3 (duct 0.75 m wide × 0.3 m high at 45 °C in 15 °C air): h_sides 4.23, h_top 5.47, h_bottom 2.07 W/(m²·K), q′ 246 W/m", () => {
    // Properties of the example at T_f = 303 K: ν 16.2e-6, α 22.9e-6, k 0.0265, Pr 0.71, β 0.0033 (as printed in the example, from memory)
    const air = { nu: 16.2e-6, alpha: 22.9e-6, k: 0.0265, Pr: 0.71, beta: 0.0033 };
    const dT = 30;
    const RaSide = rayleigh(dT, 0.3, air, 9.8);
    const RaTop = rayleigh(dT, 0.75 / 2, air, 9.8); // L = A_s/P = w/2 for a long strip
    const hs = hFromNu(nuVerticalPlateLaminar(RaSide, air.Pr), air.k, 0.3);
    const ht = hFromNu(nuPlateUp(RaTop), air.k, 0.375);
    const hb = hFromNu(nuPlateDown(RaTop), air.k, 0.375);
    expect(rel(RaSide, 7.07e7)).toBeLessThan(0.01);
    expect(rel(RaTop, 1.38e8)).toBeLessThan(0.01);
    expect(rel(hs, 4.23)).toBeLessThan(0.01);
    expect(rel(ht, 5.47)).toBeLessThan(0.01);
    expect(rel(hb, 2.07)).toBeLessThan(0.01);
    expect(rel((2 * hs * 0.3 + (ht + hb) * 0.75) * dT, 246)).toBeLessThan(0.01);
  });

  it("horizontal steam pipe, D = 0.1 m at 165 °C in 23 °C air (Incropera 6th ed. §9.6 worked example, from memory): h ≈ 7.3 W/(m²·K), q′ ≈ 325 W/m within 2 %", () => {
    const air = { k: 0.0313, nu: 22.8e-6, alpha: 32.8e-6, Pr: 0.697, beta: 2.725e-3 }; // T_f = 367 K, as printed (from memory)
    const Ra = rayleigh(142, 0.1, air, 9.8);
    expect(rel(Ra, 5.073e6)).toBeLessThan(0.005);
    const h = hFromNu(nuHorizontalCylinder(Ra, air.Pr), air.k, 0.1);
    expect(rel(h, 7.29)).toBeLessThan(0.02);
    expect(rel(h * Math.PI * 0.1 * 142, 325)).toBeLessThan(0.02);
  });

  it("hand values from the formulas: 0.54·(10⁶)^(1/4) = 17.076, 0.15·(10⁹)^(1/3) = 150, 0.27·(10⁸)^(1/4) = 27.0", () => {
    expect(nuPlateUp(1e6)).toBeCloseTo(17.0763, 3);
    expect(nuPlateUp(1e9)).toBeCloseTo(150, 6);
    expect(nuPlateDown(1e8)).toBeCloseTo(27.0, 6);
  });

  it("Churchill–Chu at Ra → 0 tends to 0.825² = 0.6806 (the conduction limit of eq. 9.26)", () => {
    expect(nuVerticalPlate(0, 0.7)).toBeCloseTo(0.825 * 0.825, 10);
  });

  it("vertical channel (Bar-Cohen & Rohsenow): limits Elenbaas fully developed Ra_S·(S/L)/24 and isolated plate 0.59·(Ra_S·S/L)^(1/4) (Incropera 6th ed. §9.7)", () => {
    const S = 0.01, L = 0.1;
    const small = 1e-2 * (L / S); // Ra_S·S/L = 0.01
    expect(rel(nuVerticalChannel(small, S, L), 0.01 / 24)).toBeLessThan(0.01);
    const large = 1e8 * (L / S); // Ra_S·S/L = 1e8
    expect(rel(nuVerticalChannel(large, S, L), 0.59 * Math.pow(1e8, 0.25))).toBeLessThan(0.01);
  });

  it("Nu grows with Ra for every correlation (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e11, noNaN: true }), fc.double({ min: 1.01, max: 10, noNaN: true }), (Ra, k) => {
        expect(nuVerticalPlate(Ra * k, 0.7)).toBeGreaterThan(nuVerticalPlate(Ra, 0.7));
        expect(nuPlateDown(Ra * k)).toBeGreaterThan(nuPlateDown(Ra));
        expect(nuHorizontalCylinder(Ra * k, 0.7)).toBeGreaterThan(nuHorizontalCylinder(Ra, 0.7));
        expect(nuVerticalChannel(Ra * k, 0.01, 0.1)).toBeGreaterThan(nuVerticalChannel(Ra, 0.01, 0.1));
      }),
      { numRuns: 100 },
    );
  });

  it("Ra outside a correlation's range gives a warning, inside none", () => {
    expect(rangeWarning("plate-up", 1e3, "top edge")?.code).toBe("convection-ra-out-of-range");
    expect(rangeWarning("plate-up", 1e3, "top edge")?.message).toMatch(/top edge/);
    expect(rangeWarning("plate-up", 1e5, "top edge")).toBeUndefined();
    expect(rangeWarning("plate-down", 5e4, "bottom")).toBeDefined();
    expect(rangeWarning("vertical-plate", 1e13, "face")).toBeDefined();
    expect(rangeWarning("vertical-plate", 1e6, "face")).toBeUndefined();
  });
});
