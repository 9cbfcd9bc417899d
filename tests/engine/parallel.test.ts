import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { parallelSharing, type ParallelSharingInput } from "../../lib/engine/parallel";
import { EngineError } from "../../lib/engine/core/result";
import { dcResistancePerMetre } from "../../lib/engine/resistance";

const bar = (name: string, length_m: number, extra: Partial<ParallelSharingInput["paths"][number]> = {}) => ({
  name,
  materialId: "cu-annealed" as const,
  area_m2: 1e-3, // 100 mm × 10 mm
  length_m,
  conductorTemperature_C: 20,
  ...extra,
});

describe("parallel sharing: DC current divider (Kirchhoff's laws)", () => {
  it("two equal paths split 50/50", () => {
    const r = parallelSharing({ mode: "dc", current_A: 1000, paths: [bar("A", 5), bar("B", 5)] }).results;
    expect(r.paths[0]!.current_A).toBeCloseTo(500, 9);
    expect(r.paths[1]!.current_A).toBeCloseTo(500, 9);
    expect(r.paths[0]!.share_pct).toBeCloseTo(50, 9);
  });

  it("unequal lengths of the same bar split in proportion to 1/L", () => {
    // Current divider: I_1 = I·(1/L_1)/(1/L_1 + 1/L_2) = 500·(1/2)/(1/2 + 1/3) = 300 A; I_2 = 200 A.
    const r = parallelSharing({ mode: "dc", current_A: 500, paths: [bar("short", 2), bar("long", 3)] }).results;
    expect(r.paths[0]!.current_A).toBeCloseTo(300, 9);
    expect(r.paths[1]!.current_A).toBeCloseTo(200, 9);
  });

  it("path resistance from IEC 60287-1-1 Table 1 resistivity and the equivalent of two paths", () => {
    // Annealed copper ρ20 = 1.7241e-8 Ω·m (IEC 60287-1-1:2006 Table 1); 10 m of 1000 mm²:
    // R = 1.7241e-8·10/1e-3 = 1.7241e-4 Ω; two such paths in parallel: 8.6205e-5 Ω.
    const r = parallelSharing({ mode: "dc", current_A: 100, paths: [bar("A", 10), bar("B", 10)] }).results;
    expect(r.paths[0]!.resistance_ohm).toBeCloseTo(1.7241e-4, 9);
    expect(r.equivalentResistance_ohm).toBeCloseTo(8.6205e-5, 10);
    // Loss: 2 × 50² × 1.7241e-4 = 0.86205 W
    expect(r.totalLoss_W).toBeCloseTo(0.86205, 6);
  });

  it("conductors in parallel within a path divide its resistance", () => {
    // Path A has 2 bars, path B 1 bar, same length: G_A = 2·G_B ⇒ I_A = 2/3·I.
    const r = parallelSharing({ mode: "dc", current_A: 900, paths: [bar("A", 4, { count: 2 }), bar("B", 4)] }).results;
    expect(r.paths[0]!.current_A).toBeCloseTo(600, 9);
    expect(r.paths[0]!.currentPerConductor_A).toBeCloseTo(300, 9);
  });
});

describe("parallel sharing: AC current divider by complex admittance", () => {
  it("Z_1 = R, Z_2 = R + jR gives I_1 = I·(0.6 + 0.2j), I_2 = I·(0.4 − 0.2j)", () => {
    // Y_1 = 1/R, Y_2 = (1 − j)/(2R); ΣY = (1.5 − 0.5j)/R
    // I_1 = I/(1.5 − 0.5j) = I·(1.5 + 0.5j)/2.5 = I·(0.6 + 0.2j) → |I_1| = 0.632456·I, ∠18.435°
    // I_2 = I·(0.5 − 0.5j)/(1.5 − 0.5j) = I·(1 − 0.5j)/2.5 = I·(0.4 − 0.2j) → |I_2| = 0.447214·I, ∠−26.565°
    const rPerM = dcResistancePerMetre("cu-annealed", 1e-3, 20);
    const r = parallelSharing({ mode: "ac", current_A: 1000, paths: [bar("R", 5), bar("RX", 5, { reactance_ohm_per_m: rPerM })] }).results;
    expect(r.paths[0]!.current_A).toBeCloseTo(632.4555, 3);
    expect(r.paths[0]!.currentAngle_deg).toBeCloseTo(18.4349, 3);
    expect(r.paths[1]!.current_A).toBeCloseTo(447.2136, 3);
    expect(r.paths[1]!.currentAngle_deg).toBeCloseTo(-26.5651, 3);
  });

  it("AC equals DC when reactance is zero and Rac/Rdc = 1", () => {
    const paths = [bar("A", 2), bar("B", 3, { materialId: "al-1350", area_m2: 2e-3 }), bar("C", 7, { count: 3 })];
    const dc = parallelSharing({ mode: "dc", current_A: 1234, paths }).results;
    const ac = parallelSharing({ mode: "ac", current_A: 1234, paths }).results;
    ac.paths.forEach((p, k) => expect(p.current_A).toBeCloseTo(dc.paths[k]!.current_A, 9));
  });
});

describe("parallel sharing: temperature, overloads, contingency", () => {
  it("temperature from ampacity: θ = θa + (θmax − θa)(I/Iz)² (common practice)", () => {
    // Two equal paths, 400 A total → 200 A each, Iz = 400 A: θ = 35 + 55·0.25 = 48.75 °C.
    const r = parallelSharing({
      mode: "dc",
      current_A: 400,
      ambient_C: 35,
      maxTemperature_C: 90,
      paths: [bar("A", 5, { ampacityPerConductor_A: 400, conductorTemperature_C: 50 }), bar("B", 5, { ampacityPerConductor_A: 400, conductorTemperature_C: 50 })],
    });
    expect(r.results.paths[0]!.temperature_C).toBeCloseTo(48.75, 9);
    expect(r.results.paths[0]!.overloaded).toBe(false);
    expect(r.checks.every((c) => c.pass)).toBe(true);
  });

  it("three equal paths of 900 A: each carries 300 A; one open → 450 A each, over a 400 A ampacity", () => {
    const p = (n: string) => bar(n, 5, { ampacityPerConductor_A: 400 });
    const r = parallelSharing({ mode: "dc", current_A: 900, paths: [p("A"), p("B"), p("C")] }).results;
    expect(r.anyOverloaded).toBe(false);
    expect(r.contingencies).toHaveLength(3);
    for (const c of r.contingencies) {
      expect(c.paths).toHaveLength(2);
      c.paths.forEach((x) => expect(x.current_A).toBeCloseTo(450, 9));
      expect(c.overloaded).toHaveLength(2);
      expect(c.maxUtilisation).toBeCloseTo(1.125, 12);
    }
  });

  it("worst contingency found by trying each open path (G ∝ 1/L: 1/2, 1/3, 1/6)", () => {
    const r = parallelSharing({
      mode: "dc",
      current_A: 1000,
      paths: [bar("short", 2, { ampacityPerConductor_A: 800 }), bar("mid", 3, { ampacityPerConductor_A: 800 }), bar("long", 6, { ampacityPerConductor_A: 800 })],
    }).results;
    // Open "short": I_mid = 1000·(1/3)/(1/3 + 1/6) = 666.67 A
    // Open "mid":   I_short = 1000·(1/2)/(1/2 + 1/6) = 750 A   ← highest
    // Open "long":  I_short = 1000·(1/2)/(1/2 + 1/3) = 600 A
    expect(r.contingencies.map((c) => c.maxCurrentPerConductor_A)).toEqual([
      expect.closeTo(666.6667, 3),
      expect.closeTo(750, 9),
      expect.closeTo(600, 9),
    ]);
    expect(r.worstContingency.openPath).toBe("mid");
    expect(r.worstContingency.maxUtilisation).toBeCloseTo(750 / 800, 12);
    expect(r.worstContingency.overloaded).toEqual([]);
  });
});

describe("parallel sharing: invariants (fast-check)", () => {
  const pathArb = fc.record({
    materialId: fc.constantFrom("cu-annealed" as const, "cu-etp" as const, "al-1350" as const, "al-6101" as const),
    area_m2: fc.double({ min: 1e-5, max: 5e-3, noNaN: true }),
    length_m: fc.double({ min: 0.1, max: 50, noNaN: true }),
    count: fc.integer({ min: 1, max: 6 }),
    conductorTemperature_C: fc.double({ min: 20, max: 120, noNaN: true }),
    reactance_ohm_per_m: fc.double({ min: 0, max: 3e-4, noNaN: true }),
  });
  const inputArb = fc.record({
    mode: fc.constantFrom("dc" as const, "ac" as const),
    current_A: fc.double({ min: 1, max: 10_000, noNaN: true }),
    paths: fc.array(pathArb, { minLength: 2, maxLength: 12 }),
  });

  it("conservation of current: Σ I_k = I (complex sum for AC), 1e-9 relative", () => {
    fc.assert(
      fc.property(inputArb, (inp) => {
        const r = parallelSharing({ ...inp, paths: inp.paths.map((p, i) => ({ ...p, name: `P${i}` })) }).results;
        let re = 0;
        let im = 0;
        for (const p of r.paths) {
          re += p.current_A * Math.cos((p.currentAngle_deg * Math.PI) / 180);
          im += p.current_A * Math.sin((p.currentAngle_deg * Math.PI) / 180);
        }
        expect(Math.abs(re - inp.current_A) / inp.current_A).toBeLessThan(1e-9);
        expect(Math.abs(im) / inp.current_A).toBeLessThan(1e-9);
      }),
      { numRuns: 100 },
    );
  });

  it("conservation of power: Σ |I_k|²R_k = |I|²·Re(Z_eq)", () => {
    fc.assert(
      fc.property(inputArb, (inp) => {
        const r = parallelSharing({ ...inp, paths: inp.paths.map((p, i) => ({ ...p, name: `P${i}` })) }).results;
        const sum = r.paths.reduce((s, p) => s + p.current_A ** 2 * p.resistance_ohm, 0);
        const total = inp.current_A ** 2 * r.equivalentResistance_ohm;
        expect(Math.abs(sum - total) / total).toBeLessThan(1e-9);
      }),
      { numRuns: 100 },
    );
  });

  it("monotonic: lengthening one path lowers its share", () => {
    fc.assert(
      fc.property(inputArb, fc.double({ min: 1.01, max: 10, noNaN: true }), (inp, factor) => {
        const paths = inp.paths.map((p, i) => ({ ...p, name: `P${i}` }));
        const a = parallelSharing({ ...inp, paths }).results.paths[0]!.share_pct;
        const longer = [{ ...paths[0]!, length_m: paths[0]!.length_m * factor }, ...paths.slice(1)];
        const b = parallelSharing({ ...inp, paths: longer }).results.paths[0]!.share_pct;
        expect(b).toBeLessThan(a);
      }),
      { numRuns: 60 },
    );
  });
});

describe("parallel sharing: input errors name the field", () => {
  const fieldOf = (f: () => unknown): string | undefined => {
    try {
      f();
    } catch (e) {
      if (e instanceof EngineError) return `${e.field}: ${e.message}`;
      throw e;
    }
    return undefined;
  };

  it("one path, duplicate names, zero length, unknown temper", () => {
    expect(fieldOf(() => parallelSharing({ mode: "dc", current_A: 10, paths: [bar("A", 1)] }))).toMatch(/^paths: .*at least 2/);
    expect(fieldOf(() => parallelSharing({ mode: "dc", current_A: 10, paths: [bar("A", 1), bar("A", 2)] }))).toMatch(/^paths\.1\.name: .*twice/);
    expect(fieldOf(() => parallelSharing({ mode: "dc", current_A: 10, paths: [bar("A", 1), bar("B", 0)] }))).toMatch(/^paths\.1\.length_m: length must be greater than 0/);
    expect(fieldOf(() => parallelSharing({ mode: "dc", current_A: 10, paths: [bar("A", 1), bar("B", 1, { temperId: "X9" })] }))).toMatch(/^paths\.1\.temperId: temper must be one of/);
  });
});
