import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { EngineError } from "../../lib/engine/core/result";
import {
  airVolumetricHeatCapacity,
  calcEnclosureHeat,
  coolingSurfaces,
  effectiveCoolingSurface,
  enclosureHeatSchema,
  INSTALLATIONS,
  SURFACE_FACTORS,
} from "../../lib/engine/enclosure-heat";

const base = { width_m: 0.8, height_m: 2.0, depth_m: 0.6 };

describe("effective cooling surface — IEC TR 60890 Table III surface factors (from memory)", () => {
  it("hand example (labelled hand-computed): 0.8 × 2.0 × 0.6 m free-standing", () => {
    // top 0.8·0.6·1.4 = 0.672; front + rear 2·(0.8·2.0)·0.9 = 2.88; sides 2·(0.6·2.0)·0.9 = 2.16 → A_e = 5.712 m²
    expect(effectiveCoolingSurface(0.8, 2.0, 0.6, "free-standing")).toBeCloseTo(5.712, 12);
  });

  it("wall mounting replaces the rear factor 0.9 by 0.5: A_e falls by 0.4·w·h", () => {
    expect(effectiveCoolingSurface(0.8, 2.0, 0.6, "free-standing") - effectiveCoolingSurface(0.8, 2.0, 0.6, "wall")).toBeCloseTo(0.4 * 0.8 * 2.0, 12);
  });

  it("floor is never counted and the surface areas add up to the enclosure's outer area", () => {
    for (const inst of INSTALLATIONS) {
      const rows = coolingSurfaces(1.2, 2.2, 0.5, inst);
      expect(rows.find((r) => r.surface === "floor")!.effective_m2).toBe(0);
      const area = rows.reduce((s, r) => s + r.area_m2, 0);
      expect(area).toBeCloseTo(2 * (1.2 * 2.2 + 1.2 * 0.5 + 0.5 * 2.2), 12);
    }
  });

  it("surface factor values", () => {
    expect(SURFACE_FACTORS).toEqual({ topExposed: 1.4, topCovered: 0.7, sideExposed: 0.9, sideCovered: 0.5, floor: 0 });
  });
});

describe("calcEnclosureHeat", () => {
  it("hand example (labelled hand-computed): 500 W in 0.8 × 2.0 × 0.6 m free-standing, k = 5.5, ambient 35 °C, target 40 °C", () => {
    // k·A_e = 5.5 · 5.712 = 31.416 W/K; ΔT = 500/31.416 = 15.915 K → 50.92 °C average.
    // Natural dissipation at 40 °C: 31.416 · 5 = 157.08 W → P_cool = 500 − 157.08 = 342.92 W.
    // Fan: ρ·c_p at 35 °C = 101325/(287.05·308.15)·1007 = 1153.5 J/(m³K); V̇ = 342.92/(1153.5·5) = 0.05946 m³/s = 214.0 m³/h.
    const r = calcEnclosureHeat({
      ...base,
      losses: [
        { name: "Incomer", loss_W: 120 },
        { name: "Feeder", loss_W: 40, quantity: 5 },
        { name: "Main busbar", loss_W: 180, sourceSheet: "busbar-1" },
      ],
    });
    expect(r.results.totalLoss_W).toBe(500);
    expect(r.results.lossBySource_W).toEqual({ devices: 320, "busbar-1": 180 });
    expect(r.results.deltaT_K).toBeCloseTo(15.915, 3);
    expect(r.results.internalAverage_C).toBeCloseTo(50.915, 3);
    expect(r.results.coolingPower_W).toBeCloseTo(342.92, 2);
    expect(r.results.naturalCoolingSuffices).toBe(false);
    expect(r.results.fanAirflow_m3_s! * 3600).toBeCloseTo(214.0, 0);
    expect(r.checks[0]!.pass).toBe(false);
    expect(r.warnings.map((w) => w.code)).toContain("ventilation");
  });

  it("air density at 15 °C, 101325 Pa is 1.225 kg/m³ (ISO 2533:1975 standard atmosphere, sea level), within 0.1 %", () => {
    const rho = airVolumetricHeatCapacity(15) / 1007;
    expect(Math.abs(rho - 1.225) / 1.225).toBeLessThan(0.001);
  });

  it("loss scales with the square of the load factor (Joule losses, common practice)", () => {
    const r = calcEnclosureHeat({ ...base, losses: [{ name: "MCCB", loss_W: 60, loadFactor: 0.8, quantity: 2 }] });
    expect(r.results.totalLoss_W).toBeCloseTo(60 * 2 * 0.64, 12);
  });

  const arbLosses = fc.array(fc.record({ name: fc.constant("x"), loss_W: fc.double({ min: 0, max: 2000, noNaN: true }) }), { minLength: 1, maxLength: 8 });
  const dim = fc.double({ min: 0.2, max: 3, noNaN: true });

  it("property: energy balance — k·A_e·ΔT = P, and P_cool = P − k·A_e·(θ_target − θ_ambient) whenever positive", () => {
    fc.assert(
      fc.property(arbLosses, dim, dim, dim, fc.constantFrom(...INSTALLATIONS), fc.double({ min: 2, max: 10, noNaN: true }), (losses, w, h, d, inst, k) => {
        const r = calcEnclosureHeat({ width_m: w, height_m: h, depth_m: d, installation: inst, heatTransfer_W_m2K: k, losses });
        const kA = k * r.results.effectiveSurface_m2;
        expect(kA * r.results.deltaT_K).toBeCloseTo(r.results.totalLoss_W, 6);
        const expected = r.results.totalLoss_W - kA * (40 - 35);
        expect(r.results.coolingPower_W).toBeCloseTo(Math.max(0, expected), 6);
        expect(r.results.naturalCoolingSuffices).toBe(r.results.internalAverage_C <= 40);
      }),
      { numRuns: 80 },
    );
  });

  it("property: more loss → higher ΔT; larger enclosure → lower ΔT; wall-mounted → higher ΔT than free-standing", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 5000, noNaN: true }), fc.double({ min: 1.01, max: 3, noNaN: true }), dim, dim, dim, (P, f, w, h, d) => {
        const run = (o: Partial<{ w: number; h: number; d: number; P: number; inst: (typeof INSTALLATIONS)[number] }>) =>
          calcEnclosureHeat({ width_m: o.w ?? w, height_m: o.h ?? h, depth_m: o.d ?? d, installation: o.inst ?? "free-standing", losses: [{ name: "load", loss_W: o.P ?? P }] }).results.deltaT_K;
        const ref = run({});
        expect(run({ P: P * f })).toBeGreaterThan(ref);
        expect(run({ w: Math.min(50, w * f) })).toBeLessThan(ref);
        expect(run({ h: Math.min(5, h * f) })).toBeLessThan(ref);
        expect(run({ inst: "wall" })).toBeGreaterThan(ref);
        expect(run({ inst: "row-centre-wall" })).toBeGreaterThan(run({ inst: "wall" }));
        expect(run({ inst: "built-in" })).toBeGreaterThan(run({ inst: "row-centre-wall" }));
      }),
      { numRuns: 80 },
    );
  });

  it("top factor raises the governing temperature and no cooling is needed below the target", () => {
    const r = calcEnclosureHeat({ ...base, losses: [{ name: "small", loss_W: 100 }], topFactor: 1.5 });
    // ΔT = 100/31.416 = 3.183 K; top = 35 + 1.5·3.183 = 39.77 °C ≤ 40 °C
    expect(r.results.internalTop_C).toBeCloseTo(39.775, 3);
    expect(r.results.naturalCoolingSuffices).toBe(true);
    expect(r.results.coolingPower_W).toBe(0);
    expect(r.results.fanAirflow_m3_s).toBeNull();
  });

  it("target not above ambient: no fan airflow, warning for closed-loop cooling", () => {
    const r = calcEnclosureHeat({ ...base, ambient_C: 45, targetInternal_C: 40, losses: [{ name: "x", loss_W: 200 }] });
    expect(r.results.fanAirflow_m3_s).toBeNull();
    expect(r.results.coolingPower_W).toBeCloseTo(200 + 31.416 * 5, 3);
    expect(r.warnings.map((w) => w.code)).toContain("target-below-ambient");
  });

  it("bad input names the field and range", () => {
    const bad = enclosureHeatSchema.safeParse({ width_m: "abc", height_m: 2, depth_m: 0.6 });
    expect(bad.success).toBe(false);
    try {
      calcEnclosureHeat({ width_m: 0.8, height_m: 9, depth_m: 0.6 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).field).toBe("height_m");
      expect((e as EngineError).message).toMatch(/Enclosure height.*0\.05 to 5 m/);
    }
    expect(() => calcEnclosureHeat({ ...base, losses: [{ name: "x", loss_W: -5 }] })).toThrow(/Power loss/);
  });
});
