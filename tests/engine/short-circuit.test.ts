import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { EngineError } from "../../lib/engine/core/result";
import { material } from "../../lib/engine/materials";
import {
  adiabaticK,
  adiabaticMaterialConstant,
  calcFaultWithstand,
  dcHeatFactorM,
  faultWithstandSchema,
  finalTemperatureAdiabatic,
  forcePerMetreFilaments,
  insulationLimits,
  kappaFromRX,
  minimumSectionAdiabatic,
  PEAK_FACTOR_ROWS,
  peakFactorRow,
  rectangularBarFactor,
  rOverXFromPowerFactor,
  subConductorEffectiveDistance,
  SUPPORT_TYPES,
  supportType,
  withstandCurrentAdiabatic,
} from "../../lib/engine/short-circuit";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("adiabatic k — IEC 60364-4-43:2008 Table 43A and IEC 60364-5-54:2011 Table A.54.5", () => {
  // [material, θi, θf, printed k, table]
  const cases: [string, number, number, number, string][] = [
    ["cu-etp", 70, 160, 115, "IEC 60364-4-43 Table 43A, PVC ≤ 300 mm², copper"],
    ["al-1350", 70, 160, 76, "IEC 60364-4-43 Table 43A, PVC ≤ 300 mm², aluminium"],
    ["cu-etp", 70, 140, 103, "IEC 60364-4-43 Table 43A, PVC > 300 mm², copper"],
    ["al-1350", 70, 140, 68, "IEC 60364-4-43 Table 43A, PVC > 300 mm², aluminium"],
    ["cu-etp", 90, 250, 143, "IEC 60364-4-43 Table 43A, EPR/XLPE, copper"],
    ["al-1350", 90, 250, 94, "IEC 60364-4-43 Table 43A, EPR/XLPE, aluminium"],
    ["cu-etp", 60, 200, 141, "IEC 60364-4-43 Table 43A, rubber 60 °C, copper"],
    ["al-1350", 60, 200, 93, "IEC 60364-4-43 Table 43A, rubber 60 °C, aluminium"],
    ["cu-etp", 105, 250, 135, "IEC 60364-4-43 Table 43A, mineral bare, copper"],
    ["cu-etp", 30, 200, 159, "IEC 60364-5-54 Table A.54.5, bare copper 200 °C"],
    ["al-1350", 30, 200, 105, "IEC 60364-5-54 Table A.54.5, bare aluminium 200 °C"],
    ["cu-etp", 30, 150, 138, "IEC 60364-5-54 Table A.54.5, bare copper 150 °C"],
    ["al-1350", 30, 150, 91, "IEC 60364-5-54 Table A.54.5, bare aluminium 150 °C"],
    ["cu-etp", 30, 500, 228, "IEC 60364-5-54 Table A.54.5, bare copper 500 °C"],
    ["al-1350", 30, 300, 125, "IEC 60364-5-54 Table A.54.5, bare aluminium 300 °C"],
  ];
  it.each(cases)("%s %d→%d °C: k = %d (%s), within 1 %", (mat, ti, tf, kPrinted) => {
    expect(rel(adiabaticK(mat, ti, tf), kPrinted)).toBeLessThan(0.01);
  });

  it("printed k values kept in insulation-limits.json agree with the formula within 1 %", () => {
    for (const id of ["pvc-le300", "pvc-gt300", "xlpe-epr", "rubber-60", "mineral-bare", "bare-30-200", "bare-30-150"]) {
      const l = insulationLimits(id);
      if (l.kCu) expect(rel(adiabaticK("cu-etp", l.continuous_C, l.shortCircuit_C), l.kCu)).toBeLessThan(0.01);
      if (l.kAl) expect(rel(adiabaticK("al-1350", l.continuous_C, l.shortCircuit_C), l.kAl)).toBeLessThan(0.01);
    }
  });

  it("material constant K: copper 226, aluminium 148 A·√s/mm² (IEC 60364-5-54:2011 Table A.54.1, from memory), within 0.5 %", () => {
    expect(rel(adiabaticMaterialConstant(material("cu-annealed")), 226)).toBeLessThan(0.005);
    expect(rel(adiabaticMaterialConstant(material("al-1350")), 148)).toBeLessThan(0.005);
  });

  it("minimum section, hand computed: 10 kA for 0.5 s with k = 115 → S = 10000·√0.5/115 = 61.49 mm²", () => {
    expect(minimumSectionAdiabatic(10_000, 0.5, 115)).toBeCloseTo(61.49, 2);
    expect(withstandCurrentAdiabatic(61.4875, 0.5, 115)).toBeCloseTo(10_000, 0);
  });

  it("final temperature at the withstand current equals the final limit (round trip)", () => {
    const cu = material("cu-etp");
    fc.assert(
      fc.property(fc.double({ min: 20, max: 90, noNaN: true }), fc.double({ min: 120, max: 300, noNaN: true }), fc.double({ min: 0.05, max: 5, noNaN: true }), fc.double({ min: 10, max: 5000, noNaN: true }), (ti, tf, t, S) => {
        const k = adiabaticK("cu-etp", ti, tf);
        const I = withstandCurrentAdiabatic(S, t, k);
        expect(finalTemperatureAdiabatic(cu, I, t, S, ti)).toBeCloseTo(tf, 6);
      }),
      { numRuns: 100 },
    );
  });

  it("rejects a final temperature not above the initial one", () => {
    expect(() => adiabaticK("cu-etp", 90, 90)).toThrow(/final temperature/);
  });
});

describe("peak factor — IEC 61439-1:2020 Table 7 cross-checked with IEC 60909-0:2016 eq. (55)", () => {
  it("row boundaries are inclusive of the upper value", () => {
    expect(peakFactorRow(5).n).toBe(1.5);
    expect(peakFactorRow(5.001).n).toBe(1.7);
    expect(peakFactorRow(10).n).toBe(1.7);
    expect(peakFactorRow(20).n).toBe(2.0);
    expect(peakFactorRow(50).n).toBe(2.1);
    expect(peakFactorRow(50.1).n).toBe(2.2);
  });

  it.each(PEAK_FACTOR_ROWS.map((r) => [r.powerFactor, r.n] as const))("cos φ = %d: κ·√2 from IEC 60909-0 reproduces n = %d within 2 %", (pf, n) => {
    // e.g. cos φ 0.25 → R/X = 0.258 → κ = 1.02 + 0.98·e^(−0.775) = 1.472 → κ√2 = 2.08 ≈ 2.1
    expect(rel(kappaFromRX(rOverXFromPowerFactor(pf)) * Math.SQRT2, n)).toBeLessThan(0.02);
  });

  it("κ spans 1.02 (R/X → ∞) to 2.0 (R/X = 0) — IEC 60909-0:2016 §8.1", () => {
    expect(kappaFromRX(0)).toBeCloseTo(2.0, 12);
    expect(kappaFromRX(100)).toBeCloseTo(1.02, 12);
  });

  it("d.c. heat factor m: → 2 for an undamped d.c. component (κ → 2), → 0 for long durations; decreasing in T_k", () => {
    // An undamped d.c. component of amplitude √2·I adds (√2·I)² = 2·I² of heat: m = 2 (physics of the Joule integral).
    expect(dcHeatFactorM(2 - 1e-9, 50, 0.1)).toBeCloseTo(2, 4);
    expect(dcHeatFactorM(1.8, 50, 100)).toBeLessThan(0.01);
    expect(dcHeatFactorM(1.8, 50, 0.1)).toBeGreaterThan(dcHeatFactorM(1.8, 50, 0.5));
  });

  it("m equals the Joule integral of a d.c. component √2·I·e^(−t/τ) with κ − 1 = e^(−1/(2fτ)), integrated numerically", () => {
    const kappa = 1.7;
    const f = 50;
    const T = 0.2;
    const tau = -1 / (2 * f * Math.log(kappa - 1));
    const N = 20000;
    let sum = 0;
    for (let i = 0; i < N; i++) {
      const t = ((i + 0.5) * T) / N;
      sum += 2 * Math.exp((-2 * t) / tau);
    }
    expect(dcHeatFactorM(kappa, f, T)).toBeCloseTo(sum / N, 6);
  });
});

describe("electromagnetic force — IEC 60865-1:2011 §5", () => {
  it("two filaments 1 m apart carrying 1 A: 2·10⁻⁷ N/m (SI definition of the ampere, CGPM 1948, SI Brochure 8th ed. §2.1.1.4)", () => {
    expect(forcePerMetreFilaments(1, 1, 1)).toBeCloseTo(2e-7, 15);
  });

  // Independent reference: midpoint-rule integration of the filament force over both cross-sections.
  function bruteFactor(s: number, d: number, b: number, N = 36): number {
    let sum = 0;
    for (let i = 0; i < N; i++)
      for (let j = 0; j < N; j++) {
        const u = s + ((i - j) * d) / N;
        for (let p = 0; p < N; p++)
          for (let r = 0; r < N; r++) {
            const v = ((p - r) * b) / N;
            sum += u / (u * u + v * v);
          }
      }
    return (s * sum) / N ** 4;
  }

  it.each([
    [0.02, 0.01, 0.1],
    [0.03, 0.01, 0.01],
    [0.1, 0.03, 0.1],
    [0.025, 0.02, 0.005],
  ])("rectangular factor at s = %d, d = %d, b = %d matches a direct numerical integration within 0.5 %", (s, d, b) => {
    expect(rel(rectangularBarFactor(s, d, b), bruteFactor(s, d, b))).toBeLessThan(0.005);
  });

  it("thin strips face to face (d → 0): k = 2(s/b)·atan(b/s) − (s/b)²·ln(1 + (b/s)²) (Dwight 1920, closed form of the strip integral)", () => {
    for (const [s, b] of [[0.02, 0.1], [0.05, 0.1], [0.2, 0.05]] as const) {
      const x = b / s;
      const strip = (2 / x) * Math.atan(x) - (1 / (x * x)) * Math.log(1 + x * x);
      expect(rel(rectangularBarFactor(s, s * 1e-3, b), strip)).toBeLessThan(1e-4);
    }
  });

  it("thin strips edge to edge (b → 0): k = (s/d²)·[(s+d)ln(s+d) − 2s·ln s + (s−d)ln(s−d)] (line-segment integral)", () => {
    for (const [s, d] of [[0.03, 0.02], [0.05, 0.01]] as const) {
      const lineSeg = (s / (d * d)) * ((s + d) * Math.log(s + d) - 2 * s * Math.log(s) + (s - d) * Math.log(s - d));
      expect(rel(rectangularBarFactor(s, d, d * 1e-3), lineSeg)).toBeLessThan(1e-4);
    }
  });

  it("far-field series and exact integral agree at the switch-over distance (20 × the larger dimension)", () => {
    const d = 0.01;
    const b = 0.08;
    const s = 20 * b;
    const below = rectangularBarFactor(s * (1 - 1e-9), d, b);
    const above = rectangularBarFactor(s * (1 + 1e-9), d, b);
    expect(Math.abs(below - above)).toBeLessThan(1e-5);
  });

  it("property: k < 1 with wide faces towards each other (b > d), k > 1 edges towards each other (b < d), k → 1 far apart (IEC 60865-1 Figure 1 trend)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.002, max: 0.05, noNaN: true }), fc.double({ min: 1.5, max: 10, noNaN: true }), fc.double({ min: 1.05, max: 10, noNaN: true }), (d, ratio, sOverD) => {
        const s = d * sOverD;
        expect(rectangularBarFactor(s, d, d * ratio)).toBeLessThan(1);
        expect(rectangularBarFactor(d * ratio * sOverD, d * ratio, d)).toBeGreaterThan(1);
        expect(Math.abs(rectangularBarFactor(200 * d * ratio, d, d * ratio) - 1)).toBeLessThan(1e-3);
      }),
      { numRuns: 60 },
    );
  });

  it("sub-conductor effective distance for two bars equals a_12/k_12 (IEC 60865-1 §5.3)", () => {
    const a12 = 0.02;
    expect(subConductorEffectiveDistance(2, 0.01, 0.1, 0.01)).toBeCloseTo(a12 / rectangularBarFactor(a12, 0.01, 0.1), 12);
  });
});

describe("support factors — IEC 60865-1:2011 Table 3 (from memory) vs beam statics", () => {
  /** Support reactions of a continuous beam with m equal spans under uniform load q = 1, l = 1, by Clapeyron's three-moment equation M_{i−1} + 4M_i + M_{i+1} = −q·l²/2 (Roark, 8th ed., §8). */
  function continuousReactions(m: number): number[] {
    const M = new Array<number>(m + 1).fill(0);
    // Gauss–Seidel on the tridiagonal system for the inner support moments.
    for (let it = 0; it < 500; it++) for (let i = 1; i < m; i++) M[i] = (-0.5 - M[i - 1]! - M[i + 1]!) / 4;
    const R: number[] = [];
    for (let i = 0; i <= m; i++) {
      let r = 0;
      if (i > 0) r += 0.5 + (M[i - 1]! - M[i]!); // right end of span i−1..i: R = q·l/2 + (M_left − M_right)/l
      if (i < m) r += 0.5 + (M[i + 1]! - M[i]!); // left end of span i..i+1
      R.push(r);
    }
    return R;
  }

  it("two-span continuous beam: α_A = 0.375, α_B = 1.25", () => {
    const R = continuousReactions(2);
    const s = supportType("continuous-2");
    expect(R[0]).toBeCloseTo(s.alphaA, 10);
    expect(R[1]).toBeCloseTo(s.alphaB, 10);
  });

  it("three-span continuous beam: α_A = 0.4, α_B = 1.1", () => {
    const R = continuousReactions(3);
    const s = supportType("continuous-3plus");
    expect(R[0]).toBeCloseTo(s.alphaA, 10);
    expect(R[1]).toBeCloseTo(s.alphaB, 10);
  });

  it("propped cantilever: fixed end 5/8, simple end 3/8 of the span load (Roark Table 8.1 case 2e)", () => {
    const s = supportType("single-fixed-simple");
    expect(s.alphaA).toBe(0.625);
    expect(s.alphaB).toBe(0.375);
  });

  it("single-span factors sum to 1 (equilibrium)", () => {
    for (const s of SUPPORT_TYPES.filter((x) => x.spans === 1)) expect(s.alphaA + s.alphaB).toBeCloseTo(1, 12);
  });
});

const bars = (over: Partial<Record<string, unknown>> = {}) => ({
  barWidth_m: 0.01,
  barThickness_m: 0.01,
  barsPerPhase: 1,
  gap_m: 0.01,
  phases: 3 as const,
  phaseSpacing_m: 1,
  orientation: "edge" as const,
  ...over,
});

describe("calcFaultWithstand", () => {
  it("hand-computed example (labelled): 10×10 mm Cu R290 bars 1 m apart, 50 kA, single span 1 m simply supported", () => {
    // Arithmetic: n = 2.1 (IEC 61439-1 Table 7, 20 < I ≤ 50 kA) → i_p = 105 kA.
    // Square bars 1 m apart: k_12 = 1 + (d² − b²)/(6a²) = 1 → a_m = 1 m.
    // F_m3' = 2·10⁻⁷ · (√3/2) · 105000² / 1 = 1909.6 N/m.
    // Z = b·d²/6 = 0.01·0.01²/6 = 1.6667·10⁻⁷ m³; σ_m = 1·1.0·1909.6·1/(8·1.6667·10⁻⁷) = 1432.2 MPa.
    // F_d = 2.7·0.5·1909.6 = 2578.0 N.  l_max = √(375·10⁶·8·1.6667·10⁻⁷/1909.6) = 0.5117 m.
    const r = calcFaultWithstand({ I_kA: 50, t_s: 1, materialId: "cu-etp", temperId: "R290", conductor: { type: "bars", arrangement: bars() }, span_m: 1, supportId: "single-simple" });
    const m = r.results.mechanical!;
    expect(r.results.ip_A).toBeCloseTo(105_000, 6);
    expect(m.forcePerMetre_N_m).toBeCloseTo(1909.6, 1);
    expect(m.atSpan!.mainStress_Pa / 1e6).toBeCloseTo(1432.2, 1);
    expect(m.atSpan!.supportForceA_N).toBeCloseTo(2578.0, 0);
    expect(m.maxSpan_m!).toBeCloseTo(0.5117, 4);
    expect(r.checks.find((c) => c.id === "bending-total")!.pass).toBe(false);
  });

  it("total stress at the longest span equals q·R_p0.2 (round trip), with and without spacers", () => {
    for (const spacer of [undefined, 0.1]) {
      const base = { I_kA: 40, t_s: 1, materialId: "cu-etp" as const, temperId: "R240", conductor: { type: "bars" as const, arrangement: bars({ barWidth_m: 0.08, barThickness_m: 0.01, barsPerPhase: 2, phaseSpacing_m: 0.12 }) }, spacerDistance_m: spacer };
      const r0 = calcFaultWithstand(base);
      const lmax = r0.results.mechanical!.maxSpan_m!;
      const r1 = calcFaultWithstand({ ...base, span_m: lmax });
      const at = r1.results.mechanical!.atSpan!;
      const governing = Math.max(at.totalStress_Pa / r1.results.mechanical!.allowedStress_Pa, at.subStress_Pa / r1.results.mechanical!.proofStress_Pa);
      expect(governing).toBeCloseTo(1, 9);
    }
  });

  it("thermal round trip: at I = withstand current the final temperature equals the limit, with the d.c. component", () => {
    const base = { t_s: 0.3, materialId: "al-6101" as const, conductor: { type: "section" as const, section_mm2: 400 }, insulationId: "bare-busbar" as const, dcComponent: true, peak: { mode: "rx" as const, rOverX: 0.1 } };
    const Iw = calcFaultWithstand({ ...base, I_kA: 10 }).results.withstandCurrent_A;
    const r = calcFaultWithstand({ ...base, I_kA: Iw / 1000 });
    expect(r.results.finalTemperature_C).toBeCloseTo(200, 6);
    expect(r.results.minimumSection_m2 * 1e6).toBeCloseTo(400, 6);
  });

  it("property: force scales with i_p² and the check fails exactly when θ_f exceeds the limit", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 100, noNaN: true }), fc.double({ min: 0.1, max: 3, noNaN: true }), (IkA, t) => {
        const inp = { t_s: t, materialId: "cu-etp" as const, conductor: { type: "bars" as const, arrangement: bars({ barWidth_m: 0.06, barThickness_m: 0.006, phaseSpacing_m: 0.08 }) }, peak: { mode: "entered" as const, n: 2 } };
        const r1 = calcFaultWithstand({ ...inp, I_kA: IkA });
        const r2 = calcFaultWithstand({ ...inp, I_kA: 2 * IkA });
        expect(r2.results.mechanical!.forcePerMetre_N_m / r1.results.mechanical!.forcePerMetre_N_m).toBeCloseTo(4, 9);
        const c = r1.checks.find((x) => x.id === "final-temperature")!;
        expect(c.pass).toBe(r1.results.finalTemperature_C <= 200);
        expect(c.pass).toBe(IkA * 1000 <= r1.results.withstandCurrent_A * (1 + 1e-12));
      }),
      { numRuns: 40 },
    );
  });

  it("bad input: names the field and range; overlapping phases is a named error", () => {
    const bad = faultWithstandSchema.safeParse({ I_kA: -3, t_s: 1, materialId: "cu-etp", conductor: { type: "section", section_mm2: 100 } });
    expect(bad.success).toBe(false);
    try {
      calcFaultWithstand({ I_kA: -3, t_s: 1, materialId: "cu-etp", conductor: { type: "section", section_mm2: 100 } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).field).toBe("I_kA");
      expect((e as EngineError).message).toMatch(/Prospective short-circuit current.*kA/);
    }
    expect(() => calcFaultWithstand({ I_kA: 30, t_s: 1, materialId: "cu-etp", conductor: { type: "bars", arrangement: bars({ phaseSpacing_m: 0.005 }) } })).toThrow(EngineError);
  });

  it("warnings: duration above 5 s and PVC ≤ 300 mm² applied to a larger section", () => {
    const r = calcFaultWithstand({ I_kA: 5, t_s: 6, materialId: "cu-etp", conductor: { type: "section", section_mm2: 400 }, insulationId: "pvc-le300" });
    const codes = r.warnings.map((w) => w.code);
    expect(codes).toContain("adiabatic-duration");
    expect(codes).toContain("section-insulation-mismatch");
  });
});
