import { describe, expect, it } from "vitest";
import fc from "fast-check";
import convert from "convert-units";
import {
  areaToKcmil, areaToM2, areaToNearestAwg, awgDiameter_m, awgNumber, awgToArea_m2, cToTemp, currentToA, kcmilToArea_m2,
  KCMIL_MM2, lengthToM, mToLength, parseConductorSize, tempToC,
} from "../../lib/engine/units";
import { fixed, sig } from "../../lib/engine/format";

describe("AWG and kcmil (ASTM B258)", () => {
  // ASTM B258-18 Table 1: diameter in inches to 4 decimals and area in circular mils. 4/0 (0.4600 in = 11.684 mm,
  // 211 600 cmil = 107.2 mm²) and 10 AWG (0.1019 in = 2.588 mm) as tabulated; 1/0, 14 and 36 from memory.
  // Tolerance: half a unit of the last tabulated place (0.00005 in) and 0.1 % on area.
  it.each([
    ["4/0", 0.46, 211600],
    ["1/0", 0.3249, 105600],
    ["10", 0.1019, 10380],
    ["14", 0.0641, 4110],
    ["36", 0.005, 25],
  ])("%s AWG: d = %s in, A = %s cmil (ASTM B258-18 Table 1)", (awg, d_in, cmil) => {
    expect(Math.abs(awgDiameter_m(awg) / 0.0254 - d_in)).toBeLessThanOrEqual(0.00005 + 1e-12);
    expect(Math.abs(areaToKcmil(awgToArea_m2(awg)) * 1000 - cmil) / cmil).toBeLessThan(1e-3);
  });

  it("4/0 AWG = 11.684 mm and 107.2 mm²; 10 AWG = 2.588 mm (ASTM B258-18 Table 1, metric columns)", () => {
    expect(awgDiameter_m("4/0") * 1e3).toBeCloseTo(11.684, 3);
    expect(awgToArea_m2("4/0") * 1e6).toBeCloseTo(107.2, 1);
    expect(awgDiameter_m("10") * 1e3).toBeCloseTo(2.588, 3);
  });

  it("gauge numbers of the aught sizes (ASTM B258 §4: 1/0 → 0 … 4/0 → −3)", () => {
    expect([awgNumber("1/0"), awgNumber("2/0"), awgNumber("3/0"), awgNumber("4/0"), awgNumber("0000")]).toEqual([0, -1, -2, -3, -3]);
    expect(() => awgNumber("5/0")).toThrow(/AWG size/);
    expect(() => awgNumber("41")).toThrow(/AWG size/);
  });

  it("each AWG step is 92^(1/39) in diameter; six steps halve the diameter within 0.3 % (common practice rule)", () => {
    expect(awgDiameter_m("10") / awgDiameter_m("16")).toBeCloseTo(2, 1.5);
    expect(Math.abs(awgDiameter_m("10") / awgDiameter_m("16") - 2) / 2).toBeLessThan(3e-3);
  });

  it("1 kcmil = 0.506707 mm² (definition of the circular mil)", () => {
    expect(KCMIL_MM2).toBeCloseTo(0.506707, 6);
    expect(kcmilToArea_m2(250) * 1e6).toBeCloseTo(126.677, 3);
    expect(areaToKcmil(kcmilToArea_m2(500))).toBeCloseTo(500, 9);
    // 4/0 AWG = 211.6 kcmil (ASTM B258-18 Table 1, circular mils 211 600)
    expect(areaToKcmil(awgToArea_m2("4/0"))).toBeCloseTo(211.6, 1);
  });

  it("nearest AWG", () => {
    expect(areaToNearestAwg(107e-6)).toBe("4/0");
    expect(areaToNearestAwg(5.3e-6)).toBe("10");
    expect(areaToNearestAwg(300e-6)).toBeUndefined();
  });

  it("parses sizes the trade's way", () => {
    expect(parseConductorSize("4/0")).toBeCloseTo(awgToArea_m2("4/0"), 15);
    expect(parseConductorSize("10 AWG")).toBeCloseTo(awgToArea_m2("10"), 15);
    expect(parseConductorSize("250 MCM")).toBeCloseTo(kcmilToArea_m2(250), 15);
    expect(parseConductorSize("95 mm²")).toBeCloseTo(95e-6, 15);
    expect(() => parseConductorSize("big")).toThrow(/not understood/);
  });
});

describe("length, area, temperature, current against convert-units", () => {
  // convert-units carries the foot as 1/3.28084 m (6 figures): agreement within 2e-6 relative.
  const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-12);
  it.each(["mm", "cm", "m", "km", "in", "ft", "yd", "mi"] as const)("length %s", (u) => {
    fc.assert(fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (v) => rel(lengthToM(v, u), convert(v).from(u).to("m")) < 2e-6));
    expect(mToLength(lengthToM(7.5, u), u)).toBeCloseTo(7.5, 12);
  });
  it("exact inch and foot (international yard and pound, 1959)", () => {
    expect(lengthToM(1000, "ft")).toBe(304.8);
    expect(lengthToM(1, "in")).toBe(0.0254);
  });
  it.each(["mm2", "cm2", "m2", "in2"] as const)("area %s", (u) => {
    expect(rel(areaToM2(3.7, u), convert(3.7).from(u).to("m2"))).toBeLessThan(2e-6);
  });
  it("temperature: 212 °F = 100 °C, −40 °F = −40 °C, 0 °C = 273.15 K, and convert-units", () => {
    expect(tempToC(212, "F")).toBeCloseTo(100, 12);
    expect(tempToC(-40, "F")).toBeCloseTo(-40, 12);
    expect(cToTemp(0, "K")).toBeCloseTo(273.15, 12);
    fc.assert(fc.property(fc.double({ min: -100, max: 500, noNaN: true }), (v) => Math.abs(tempToC(v, "F") - convert(v).from("F").to("C")) < 1e-9));
  });
  it("current", () => {
    expect(currentToA(2.5, "kA")).toBe(2500);
    expect(convert(2.5).from("kA").to("A")).toBe(currentToA(2.5, "kA"));
  });
});

describe("format (decimal rounding, half away from zero)", () => {
  it("significant figures", () => {
    expect(sig(2.675, 3)).toBe("2.68"); // binary 2.675 is 2.67499…; decimal rounding gives 2.68
    expect(sig(0.075449, 3)).toBe("0.0754");
    expect(sig(1234.5, 2)).toBe("1200");
    expect(sig(-0.000123456, 3)).toBe("-0.000123");
    expect(sig(0, 3)).toBe("0.00");
    expect(sig(1.5e-9, 2)).toBe("1.5e-9");
  });
  it("fixed decimals", () => {
    expect(fixed(2.675, 2)).toBe("2.68");
    expect(fixed(-0.001, 2)).toBe("0.00");
    expect(fixed(12.3, 2)).toBe("12.30");
    expect(() => fixed(1, -1)).toThrow(/decimals/);
  });
  it("sig keeps n significant digits (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e12, noNaN: true }), fc.integer({ min: 1, max: 8 }), (x, n) => {
        const s = sig(x, n);
        return Math.abs(Number(s) - x) <= 0.5 * 10 ** (Math.floor(Math.log10(x)) - n + 1) * (1 + 1e-9);
      }),
    );
  });
});
