import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  calcResistance, dcResistancePerMetre, iecProximityFactor, iecSkinFactor, iecX, resistanceInputSchema, roundConductorAc, roundConductorDc,
} from "../../lib/engine/resistance";
import { iec60228MaxResistance, iec60228Sizes, standardMetricSizes, usConductorSize, usConductorSizes, flatBarSizes } from "../../lib/engine/conductors";
import { fieldErrors } from "../../lib/engine/core/schema";
import { roundSkinRatioExact } from "../../lib/engine/kelvin";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("DC resistance", () => {
  it("annealed copper 1 mm² at 20 °C = 1/58 Ω/m·mm² = 0.017241 Ω/m (IEC 60028)", () => {
    expect(dcResistancePerMetre("cu-annealed", 1e-6, 20)).toBeCloseTo(0.017241, 6);
  });
  it("temperature correction (234.5 + θ)/(254.5) for copper, (228 + θ)/248 for aluminium (IEC 60287-1-1 §2.1.1, β from IEC 60949 Table I)", () => {
    expect(dcResistancePerMetre("cu-annealed", 1e-6, 90) / dcResistancePerMetre("cu-annealed", 1e-6, 20)).toBeCloseTo(324.5 / 254.5, 12);
    expect(dcResistancePerMetre("al-1350", 1e-6, 70) / dcResistancePerMetre("al-1350", 1e-6, 20)).toBeCloseTo(298 / 248, 12);
    // α20 = 0.00393 /K for annealed copper (IEC 60028): R90/R20 ≈ 1 + 70·0.00393 = 1.275 within 0.1 %
    expect(rel(dcResistancePerMetre("cu-annealed", 1e-6, 90) / dcResistancePerMetre("cu-annealed", 1e-6, 20), 1 + 70 * 0.00393)).toBeLessThan(1e-3);
  });
  it("Cu-ETP R200 busbar 100 × 10 mm at 20 °C: 1/(58 MS/m × 1000 mm²) = 17.24 µΩ/m (EN 13601 conductivity 58 MS/m, from memory)", () => {
    expect(dcResistancePerMetre("cu-etp", 100e-3 * 10e-3, 20, "R200") * 1e6).toBeCloseTo(17.24, 2);
  });
  it("rejects a non-positive area", () => {
    expect(() => dcResistancePerMetre("cu-etp", 0, 20)).toThrow(/area/);
  });
  it("resistance falls as area rises and rises with temperature (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-7, max: 1e-2, noNaN: true }), fc.double({ min: -40, max: 200, noNaN: true }), (a, t) => {
        const r = dcResistancePerMetre("cu-etp", a, t);
        return dcResistancePerMetre("cu-etp", a * 1.1, t) < r && dcResistancePerMetre("cu-etp", a, t + 5) > r;
      }),
    );
  });
});

describe("IEC 60228 maxima", () => {
  // IEC 60228:2004 Table 2, class 2 plain copper, Ω/km at 20 °C.
  it.each([
    [1.5, 12.1], [2.5, 7.41], [4, 4.61], [6, 3.08], [10, 1.83], [16, 1.15], [25, 0.727], [35, 0.524], [50, 0.387], [70, 0.268],
    [95, 0.193], [120, 0.153], [150, 0.124], [185, 0.0991], [240, 0.0754], [300, 0.0601], [400, 0.047], [500, 0.0366], [630, 0.0283],
  ])("class 2 Cu %s mm² = %s Ω/km (IEC 60228:2004 Table 2)", (a, r) => {
    const res = roundConductorDc({ materialId: "cu-annealed", area_m2: a * 1e-6, theta_C: 20, construction: "stranded", nominalMetric: true });
    expect(res.method).toBe("iec60228");
    expect(res.r20_ohm_m * 1000).toBeCloseTo(r, 6);
  });

  it("every tabulated maximum lies between ρ20/A and 1.15·ρ20/A (class 5: 1.20) (IEC 60287-1-1 Table 1 resistivities; the maxima allow for nominal-area tolerance and lay — common practice)", () => {
    for (const cls of [1, 2, 5] as const) {
      for (const metal of ["copper", "aluminium"] as const) {
        const rho = metal === "copper" ? 1.7241e-8 : 2.8264e-8;
        for (const a of iec60228Sizes(cls, metal)) {
          const r = iec60228MaxResistance(a, cls, metal)!.maxResistance20_ohm_m;
          const ratio = r / (rho / (a * 1e-6));
          expect(ratio, `class ${cls} ${metal} ${a} mm²`).toBeGreaterThan(0.995);
          expect(ratio, `class ${cls} ${metal} ${a} mm²`).toBeLessThan(cls === 5 ? 1.2 : 1.15);
        }
      }
    }
    expect(standardMetricSizes()).toContain(630);
  });

  it("90 °C resistance of 95 mm² class 2 Cu: 0.193 × 324.5/254.5 = 0.2461 Ω/km (IEC 60287-1-1 §2.1.1)", () => {
    const r = roundConductorDc({ materialId: "cu-annealed", area_m2: 95e-6, theta_C: 90, construction: "stranded", nominalMetric: true });
    expect(r.rdc_ohm_m * 1000).toBeCloseTo(0.2461, 4);
  });

  it("a size outside the table falls back to resistivity with a 2 % stranding allowance", () => {
    const r = roundConductorDc({ materialId: "cu-annealed", area_m2: 100e-6, theta_C: 20, construction: "stranded", nominalMetric: true });
    expect(r.method).toBe("resistivity");
    expect(r.r20_ohm_m).toBeCloseTo((1.7241e-8 * 1.02) / 100e-6, 12);
  });
});

describe("NFPA 70 (NEC) Chapter 9 Table 8, 75 °C — from memory", () => {
  it("every tabulated AWG/kcmil value within 1 % of ρ75·k/A (k = 1 solid, 1.02 stranded; ASTM B258 areas)", () => {
    const sizes = usConductorSizes();
    expect(sizes.length).toBeGreaterThanOrEqual(24);
    for (const s of sizes) {
      const { copperSolid, copperStranded, aluminiumStranded } = s.nec75_ohm_m;
      if (copperSolid) expect(rel(roundConductorDc({ materialId: "cu-annealed", area_m2: s.area_m2, theta_C: 75, construction: "solid" }).rdc_ohm_m, copperSolid), s.size).toBeLessThan(0.01);
      if (copperStranded) expect(rel(roundConductorDc({ materialId: "cu-annealed", area_m2: s.area_m2, theta_C: 75, construction: "stranded" }).rdc_ohm_m, copperStranded), s.size).toBeLessThan(0.01);
      if (aluminiumStranded) expect(rel(roundConductorDc({ materialId: "al-1350", area_m2: s.area_m2, theta_C: 75, construction: "stranded" }).rdc_ohm_m, aluminiumStranded), s.size).toBeLessThan(0.01);
    }
  });
  it("4/0 copper stranded = 0.0608 Ω/kft; 10 AWG solid 1.21, stranded 1.24 Ω/kft (NEC Ch. 9 Table 8, from memory)", () => {
    expect(usConductorSize("4/0")!.nec75_ohm_m.copperStranded! * 304.8).toBeCloseTo(0.0608, 6);
    expect(usConductorSize("250 MCM")).toBeDefined();
    const r = (size: string, c: "solid" | "stranded") => roundConductorDc({ materialId: "cu-annealed", area_m2: usConductorSize(size)!.area_m2, theta_C: 75, construction: c }).rdc_ohm_m * 304.8;
    expect(r("4/0", "stranded")).toBeCloseTo(0.0608, 3);
    expect(r("10", "solid")).toBeCloseTo(1.21, 2);
    expect(r("10", "stranded")).toBeCloseTo(1.24, 2);
  });
});

describe("IEC 60287-1-1 AC resistance", () => {
  it("y_s ranges are continuous at x_s = 2.8 and 3.8 within the formulas' rounding (IEC 60287-1-1 §2.1.2)", () => {
    expect(Math.abs(iecSkinFactor(2.8) - iecSkinFactor(2.8 + 1e-9))).toBeLessThan(0.003);
    expect(Math.abs(iecSkinFactor(3.8) - iecSkinFactor(3.8 + 1e-9))).toBeLessThan(0.003);
  });

  it("x_s of 95 mm² Cu at 90 °C, 50 Hz = √(8π·50/0.2461e-3·1e-7) ≈ 0.7146 and y_s matches the exact Kelvin solution within 1e-4", () => {
    const ac = roundConductorAc({ materialId: "cu-annealed", area_m2: 95e-6, theta_C: 90, frequency_Hz: 50, construction: "stranded", nominalMetric: true });
    expect(ac.xs).toBeCloseTo(Math.sqrt(((8 * Math.PI * 50) / 0.2461e-3) * 1e-7), 3);
    expect(Math.abs(ac.ys - (roundSkinRatioExact(ac.xs) - 1))).toBeLessThan(1e-4);
    expect(ac.yp).toBe(0);
    expect(ac.rac).toBeCloseTo(ac.rdc * (1 + ac.ys), 15);
  });

  it("y_p for three single-core cables falls with spacing and vanishes far apart (IEC 60287-1-1 §2.1.4)", () => {
    const xp = iecX(50, 0.0754e-3 * 1.275, 1);
    const d = 0.0185;
    const near = iecProximityFactor(xp, d, 2 * d, "three-single-core");
    const far = iecProximityFactor(xp, d, 20 * d, "three-single-core");
    expect(near).toBeGreaterThan(far);
    expect(far).toBeLessThan(near / 50);
    // two-core: F·(d/s)²·2.9
    const F = xp ** 4 / (192 + 0.8 * xp ** 4);
    expect(iecProximityFactor(xp, d, 2 * d, "two-core")).toBeCloseTo(F * 0.25 * 2.9, 12);
  });

  it("proximity effect and reactance with spacing; warning beyond x_p = 2.8", () => {
    const ac = roundConductorAc({ materialId: "cu-annealed", area_m2: 240e-6, theta_C: 90, frequency_Hz: 50, construction: "stranded", nominalMetric: true, spacing_m: 0.04 });
    expect(ac.yp).toBeGreaterThan(0);
    // trefoil inductance 0.05 + 0.2·ln(2s/d) mH/km (common practice)
    const L = (0.05 + 0.2 * Math.log((2 * 0.04) / ac.diameter_m)) * 1e-6;
    expect(ac.reactance!).toBeCloseTo(2 * Math.PI * 50 * L, 12);
    const big = roundConductorAc({ materialId: "cu-annealed", area_m2: 2000e-6, theta_C: 20, frequency_Hz: 400, construction: "solid", spacing_m: 0.1 });
    expect(big.warnings.map((w) => w.code)).toContain("proximity-outside-validity");
    expect(() => roundConductorAc({ materialId: "cu-annealed", area_m2: 240e-6, theta_C: 90, frequency_Hz: 50, construction: "stranded", spacing_m: 0.005 })).toThrow(/spacing/);
  });
});

describe("calcResistance", () => {
  const base = { materialId: "cu-annealed", temperature_C: 90, frequency_Hz: 50, length_m: 100, parallel: 1 };

  it("round 95 mm², 100 m: totals are per-metre × length; IEC 60228 method", () => {
    const r = calcResistance({ ...base, conductor: { type: "round", construction: "stranded", size: { unit: "mm2", value: 95 } } });
    expect(r.kind).toBe("resistance");
    expect(r.results.method).toBe("iec60228");
    expect(r.results.rdcTotal_ohm).toBeCloseTo(0.02461, 5);
    expect(r.results.racTotal_ohm).toBeCloseTo(r.results.rac_ohm_m * 100, 12);
    expect(r.results.racOverRdc).toBeGreaterThan(1);
    expect(r.warnings.map((w) => w.code)).toContain("no-spacing");
    expect(r.formulas.some((f) => f.source.includes("IEC 60287-1-1"))).toBe(true);
  });

  it("AWG and kcmil sizes; two sets in parallel halve the resistance", () => {
    const one = calcResistance({ ...base, temperature_C: 75, frequency_Hz: 0, length_m: 304.8, conductor: { type: "round", construction: "stranded", size: { unit: "awg", value: "4/0" } } });
    expect(one.results.rdcTotal_ohm).toBeCloseTo(0.0608, 3); // NEC Ch. 9 Table 8 (from memory)
    const two = calcResistance({ ...base, parallel: 2, conductor: { type: "round", construction: "stranded", size: { unit: "kcmil", value: 500 } } });
    const single = calcResistance({ ...base, conductor: { type: "round", construction: "stranded", size: { unit: "kcmil", value: 500 } } });
    expect(two.results.rdc_ohm_m).toBeCloseTo(single.results.rdc_ohm_m / 2, 15);
    expect(two.warnings.map((w) => w.code)).toContain("parallel-equal-sharing");
  });

  it("flat bars by the filament method; DC at 0 Hz", () => {
    const bars = { type: "bars", barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.15, orientation: "edge" };
    const ac = calcResistance({ ...base, materialId: "cu-etp", temperId: "R200", conductor: bars });
    expect(ac.results.method).toBe("filament");
    expect(ac.results.racOverRdc).toBeGreaterThan(1.1);
    expect(ac.results.bars!.perBar).toHaveLength(6);
    const dc = calcResistance({ ...base, materialId: "cu-etp", frequency_Hz: 0, conductor: bars });
    expect(dc.results.racOverRdc).toBeCloseTo(1, 9);
    expect(dc.results.rdc_ohm_m).toBeCloseTo(dcResistancePerMetre("cu-etp", 2e-3, 90), 15);
  });

  it("bad input names the field and the allowed range", () => {
    const r = resistanceInputSchema.safeParse({ ...base, frequency_Hz: 5000, temperId: "X", conductor: { type: "round", construction: "stranded", size: { unit: "awg", value: "22" } } });
    expect(r.success).toBe(false);
    const e = fieldErrors(r.error!);
    expect(e["frequency_Hz"]).toMatch(/Frequency must be from 0 to 1000 Hz/);
    expect(e["conductor.size.value"]).toMatch(/14…1/);
    const t = resistanceInputSchema.safeParse({ ...base, temperId: "X", conductor: { type: "round", construction: "stranded", size: { unit: "mm2", value: 95 } } });
    expect(fieldErrors(t.error!)["temperId"]).toMatch(/Temper must be one of/);
    const b = resistanceInputSchema.safeParse({ ...base, conductor: { type: "bars", barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 4, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.05, orientation: "edge" } });
    expect(fieldErrors(b.error!)["conductor.phaseSpacing_m"]).toMatch(/pack thickness/);
    expect(() => calcResistance({})).toThrow();
  });

  it("flat bar table carries a source and the common sizes", () => {
    const names = flatBarSizes("metric").map((b) => b.name);
    for (const n of ["12×2", "40×10", "100×10", "200×10"]) expect(names).toContain(n);
    expect(flatBarSizes("inch").find((b) => b.name === "1/4×1 in")!.thickness_m).toBeCloseTo(0.00635, 9);
  });
});
