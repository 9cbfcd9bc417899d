import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  cableAmpacity,
  cableConstruction,
  conductorTemperatureInAir,
  heatDissipationCoefficient,
  surfaceRiseFourthRoot,
  type CableAmpacityInput,
} from "../../lib/engine/cable-ampacity";

/**
 * Reference: IEC 60364-5-52:2009 Tables B.52.10 (PVC, 70 °C) and B.52.12 (XLPE, 90 °C), copper,
 * 30 °C air — method E (multi-core cable in free air) and method F (single-core cables in trefoil,
 * touching). Values from memory (they match the example CSV shipped in reference-tables).
 *
 * Tolerance ±15 %. The printed tables were derived with IEC 60287 for particular constructions;
 * this model differs: conductor and insulation dimensions are nominal (IEC 60502-1, from memory),
 * T1 of multi-core cables is taken core by core without the belted-cable geometric factor, method E
 * includes cables on perforated trays while the model is a cable alone in still air, and the
 * printed values are rounded.
 */
const cases: { label: string; input: CableAmpacityInput; printed: number }[] = [
  { label: "XLPE 3-core 2.5 mm², method E", input: { insulation: "xlpe", cores: 3, area_m2: 2.5e-6 }, printed: 32 },
  { label: "XLPE 3-core 25 mm², method E", input: { insulation: "xlpe", cores: 3, area_m2: 25e-6 }, printed: 127 },
  { label: "XLPE 3-core 95 mm², method E", input: { insulation: "xlpe", cores: 3, area_m2: 95e-6 }, printed: 298 },
  { label: "XLPE 3-core 240 mm², method E", input: { insulation: "xlpe", cores: 3, area_m2: 240e-6 }, printed: 538 },
  { label: "PVC 3-core 2.5 mm², method E", input: { insulation: "pvc", cores: 3, area_m2: 2.5e-6 }, printed: 25 },
  { label: "PVC 3-core 16 mm², method E", input: { insulation: "pvc", cores: 3, area_m2: 16e-6 }, printed: 80 },
  { label: "PVC 3-core 70 mm², method E", input: { insulation: "pvc", cores: 3, area_m2: 70e-6 }, printed: 196 },
  { label: "XLPE 1-core 25 mm² trefoil, method F", input: { insulation: "xlpe", cores: 1, arrangement: "trefoil", area_m2: 25e-6 }, printed: 141 },
  { label: "XLPE 1-core 50 mm² trefoil, method F", input: { insulation: "xlpe", cores: 1, arrangement: "trefoil", area_m2: 50e-6 }, printed: 216 },
  { label: "XLPE 1-core 240 mm² trefoil, method F", input: { insulation: "xlpe", cores: 1, arrangement: "trefoil", area_m2: 240e-6 }, printed: 634 },
  { label: "PVC 1-core 95 mm² trefoil, method F", input: { insulation: "pvc", cores: 1, arrangement: "trefoil", area_m2: 95e-6 }, printed: 264 },
  { label: "PVC 1-core 300 mm² trefoil, method F", input: { insulation: "pvc", cores: 1, arrangement: "trefoil", area_m2: 300e-6 }, printed: 561 },
];

describe("IEC 60287 free-air rating against IEC 60364-5-52 Tables B.52.10/B.52.12 (±15 %)", () => {
  for (const c of cases) {
    it(c.label, () => {
      const r = cableAmpacity(c.input);
      expect(Math.abs(r.results.ampacity_A - c.printed) / c.printed).toBeLessThan(0.15);
    });
  }
});

describe("heat balance consistency", () => {
  it("the conductor temperature at the rated current is θ_max (within 1e-6 K)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(1.5e-6, 4e-6, 16e-6, 50e-6, 120e-6, 300e-6),
        fc.constantFrom("pvc" as const, "xlpe" as const),
        fc.constantFrom(1, 3, 4),
        fc.constantFrom("single" as const, "trefoil" as const, "flat-touching" as const, "wall-single" as const),
        fc.double({ min: 0, max: 50, noNaN: true }),
        (area, insulation, cores, arrangement, ambient) => {
          const input: CableAmpacityInput = { area_m2: area, insulation, cores, arrangement, ambient_C: ambient };
          const r = cableAmpacity(input);
          expect(conductorTemperatureInAir(input, r.results.ampacity_A)).toBeCloseTo(r.results.thetaMax_C, 6);
        },
      ),
      { numRuns: 40 },
    );
  });

  it("IEC 60287-2-1 §4.2.1.2 iteration converges to the fixed point Δθs = Δθ/(1 + K_A·Δθs^¼)", () => {
    const { value } = surfaceRiseFourthRoot(55, 0.8);
    expect(value ** 4).toBeCloseTo(55 / (1 + 0.8 * value), 9);
  });

  it("h = Z/D_e^g + E with Table 2 constants: single cable Z 0.21, E 3.94, g 0.60", () => {
    // D_e = 0.03 m: 0.03^0.6 = e^(0.6·ln 0.03) = 0.12197; 0.21/0.12197 + 3.94 = 5.6617
    expect(heatDissipationCoefficient("single", 0.03)).toBeCloseTo(0.21 / Math.pow(0.03, 0.6) + 3.94, 12);
    expect(heatDissipationCoefficient("single", 0.03)).toBeCloseTo(5.6617, 3);
  });
});

describe("monotonic behaviour and construction", () => {
  it("rating rises with size and falls with ambient; XLPE (90 °C) rates above PVC (70 °C)", () => {
    const a = cableAmpacity({ area_m2: 50e-6, cores: 3, insulation: "xlpe" }).results.ampacity_A;
    const b = cableAmpacity({ area_m2: 70e-6, cores: 3, insulation: "xlpe" }).results.ampacity_A;
    const hot = cableAmpacity({ area_m2: 50e-6, cores: 3, insulation: "xlpe", ambient_C: 45 }).results.ampacity_A;
    const pvc = cableAmpacity({ area_m2: 50e-6, cores: 3, insulation: "pvc" }).results.ampacity_A;
    expect(b).toBeGreaterThan(a);
    expect(hot).toBeLessThan(a);
    expect(pvc).toBeLessThan(a);
  });

  it("ambient at or above θ_max gives zero current and a warning", () => {
    const r = cableAmpacity({ area_m2: 25e-6, insulation: "pvc", ambient_C: 75 });
    expect(r.results.ampacity_A).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain("ambient-above-limit");
  });

  it("construction follows IEC 60502-1 rules: sheath 0.035·D + 1.0 mm, at least 1.4 mm (single-core)", () => {
    const c = cableConstruction("xlpe", 240e-6, 1);
    // XLPE 240 mm²: t1 = 1.7 mm (IEC 60502-1, from memory); d_c = √(4·240/(π·0.92)) = √332.15 = 18.225 mm
    expect(c.insulationThickness_m).toBeCloseTo(1.7e-3, 9);
    expect(c.conductorDiameter_m * 1e3).toBeCloseTo(18.225, 2);
    const D = c.conductorDiameter_m + 2 * c.insulationThickness_m;
    expect(c.coveringThickness_m).toBeCloseTo(Math.max(1.4e-3, Math.round((0.035 * D + 1e-3) * 1e4) / 1e4), 9);
    expect(cableConstruction("pvc", 1.5e-6, 1).coveringThickness_m).toBeCloseTo(1.4e-3, 9);
  });

  it("states the LV simplifications and flags the multi-core T1 approximation", () => {
    const r = cableAmpacity({ area_m2: 35e-6, cores: 4, loadedConductors: 3 });
    const codes = r.warnings.map((w) => w.code);
    expect(codes).toContain("lv-simplification");
    expect(codes).toContain("multicore-T1");
    expect(r.results.loadedConductors).toBe(3);
  });

  it("bad input names the field", () => {
    expect(() => cableAmpacity({ area_m2: -1 })).toThrow(/Conductor cross-section/);
    expect(() => cableAmpacity({ area_m2: 25e-6, cores: 9 })).toThrow(/Cores per cable.*1 to 5/);
  });
});
