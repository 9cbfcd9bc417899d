import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { ZodError } from "zod";
import {
  applicableLimitPercent,
  conductorTemperatureAtLoad,
  feederDropPercent,
  standardSizes,
  voltageDrop,
  voltageDropApprox,
  voltageDropExact,
  voltageDropInputSchema,
} from "../../lib/engine/voltage-drop";
import { EngineError } from "../../lib/engine/core/result";
import { fieldErrors } from "../../lib/engine/core/schema";

const U0_400 = 400 / Math.sqrt(3);

describe("IEC 60364-5-52:2009 Annex G formula, u = b·(ρ1·L/S·cos φ + λ·L·sin φ)·I_B", () => {
  it("three-phase copper 16 mm², 100 m, 50 A, cos φ 0.8", () => {
    // ρ1 = 0.0225 Ω·mm²/m (Annex G), λ = 0.08 mΩ/m (Annex G), b = 1:
    // 0.0225·100/16·0.8 = 0.1125 Ω; 0.08e-3·100·0.6 = 0.0048 Ω; u = (0.1125 + 0.0048)·50 = 5.865 V
    // Δu = 100·5.865/(400/√3) = 2.5396 %
    const r = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 50, powerFactor: 0.8, length_m: 100, area_m2: 16e-6, temperatureBasis: "annex-g", method: "approximate" });
    expect(r.results.u_V).toBeCloseTo(5.865, 9);
    expect(r.results.drop_percent).toBeCloseTo((100 * 5.865) / U0_400, 9);
    expect(r.results.drop_V).toBeCloseTo(5.865 * Math.sqrt(3), 9);
  });

  it("single-phase copper 2.5 mm², 30 m, 16 A, cos φ 1", () => {
    // b = 2: u = 2·0.0225·30/2.5·16 = 2·0.27·16 = 8.64 V; Δu = 100·8.64/230 = 3.7565 %
    const r = voltageDrop({ system: "ac-1ph-2w", nominalVoltage_V: 230, current_A: 16, powerFactor: 1, length_m: 30, area_m2: 2.5e-6, temperatureBasis: "annex-g", method: "approximate" });
    expect(r.results.u_V).toBeCloseTo(8.64, 9);
    expect(r.results.drop_percent).toBeCloseTo(864 / 230, 9);
  });

  it("three-phase aluminium 95 mm², 200 m, 150 A, cos φ 0.9", () => {
    // ρ1 = 0.036 Ω·mm²/m: 0.036·200/95 = 0.0757895 Ω, ·0.9 = 0.0682105 Ω;
    // sin φ = √(1 − 0.81) = 0.4358899; λ·L·sin φ = 0.08e-3·200·0.4358899 = 0.0069742 Ω
    // u = (0.0682105 + 0.0069742)·150 = 11.27771 V
    const expected = (((0.036 * 200) / 95) * 0.9 + 0.08e-3 * 200 * Math.sqrt(1 - 0.81)) * 150;
    expect(expected).toBeCloseTo(11.2777, 3);
    const r = voltageDrop({ system: "ac-3ph-3w", nominalVoltage_V: 400, current_A: 150, powerFactor: 0.9, length_m: 200, materialId: "al-1350", area_m2: 95e-6, temperatureBasis: "annex-g", method: "approximate" });
    expect(r.results.u_V).toBeCloseTo(expected, 9);
  });
});

describe("handbook worked example", () => {
  // Schneider Electric, Electrical Installation Guide, chapter G §5.2 (voltage drop), Table G28 and
  // its example 1 — from memory: 35 mm² copper, 50 m, three-phase 400 V motor, 100 A at cos φ 0.8
  // in service (1 V/A/km → 5 V) and 500 A at cos φ 0.35 at start (0.52 V/A/km → 13 V). The table is
  // computed with ρ = 22.5 Ω·mm²/km and X = 0.08 Ω/km, i.e. the Annex G basis. Tolerance ±3 %:
  // the table prints two significant figures.
  it("service: about 5 V line to line", () => {
    const r = voltageDrop({ system: "ac-3ph-3w", nominalVoltage_V: 400, current_A: 100, powerFactor: 0.8, length_m: 50, area_m2: 35e-6, temperatureBasis: "annex-g", method: "approximate" });
    // Table value 1 V/A/km is 0.974 rounded: 100 A·0.05 km·1 = 5 V, tolerance ±3 %.
    expect(Math.abs(r.results.drop_V - 5) / 5).toBeLessThan(0.03);
  });
  it("starting: about 13 V line to line", () => {
    const r = voltageDrop({ system: "ac-3ph-3w", nominalVoltage_V: 400, current_A: 500, powerFactor: 0.35, length_m: 50, area_m2: 35e-6, temperatureBasis: "annex-g", method: "approximate" });
    expect(Math.abs(r.results.drop_V - 13) / 13).toBeLessThan(0.03);
  });
});

describe("NEC Chapter 9 Table 9, note 2: effective Z = R·cos θ + X·sin θ", () => {
  // 12 AWG uncoated copper in PVC conduit: R_ac = 2.0 Ω/kft, X_L = 0.054 Ω/kft, printed effective Z at
  // 0.85 PF = 1.7 Ω/kft (NFPA 70 Chapter 9 Table 9 — from memory). Exactly: 2.0·0.85 + 0.054·0.5268 = 1.72845.
  const kft = 304.8;
  const zEff = 2.0 * 0.85 + 0.054 * Math.sqrt(1 - 0.85 ** 2);
  it("effective Z rounds to the printed 1.7 Ω/kft", () => {
    expect(zEff).toBeCloseTo(1.72845, 4);
    expect(Math.abs(zEff - 1.7)).toBeLessThan(0.05);
  });
  it("single-phase 120 V, 16 A, 100 ft: VD = 2·Z_eff·I·L", () => {
    const r = voltageDrop({
      system: "ac-1ph-2w",
      nominalVoltage_V: 120,
      current_A: 16,
      powerFactor: 0.85,
      frequency_Hz: 60,
      length_m: 100 * 0.3048,
      area_m2: 3.309e-6,
      resistance20_ohm_per_m: 2.0 / kft,
      temperatureBasis: "given",
      conductorTemperature_C: 20,
      reactance_ohm_per_m: 0.054 / kft,
      method: "approximate",
      sizeSeries: "awg-kcmil",
    });
    // 2·1.72845/1000·16·100 = 5.5310 V; skin effect of 12 AWG at 60 Hz is < 1e-5 (IEC 60287-1-1 §2.1.2).
    expect(r.results.drop_V).toBeCloseTo((2 * zEff * 16 * 100) / 1000, 3);
  });
  it("three-phase 480 V, 100 A, 200 ft: VD_LL = √3·Z_eff·I·L", () => {
    const r = voltageDrop({
      system: "ac-3ph-3w",
      nominalVoltage_V: 480,
      current_A: 100,
      powerFactor: 0.85,
      frequency_Hz: 60,
      length_m: 200 * 0.3048,
      area_m2: 3.309e-6,
      resistance20_ohm_per_m: 2.0 / kft,
      temperatureBasis: "given",
      conductorTemperature_C: 20,
      reactance_ohm_per_m: 0.054 / kft,
      method: "approximate",
      sizeSeries: "awg-kcmil",
    });
    expect(r.results.drop_V).toBeCloseTo((Math.sqrt(3) * zEff * 100 * 200) / 1000, 2);
  });
});

describe("exact phasor method", () => {
  it("receiving end given: |V_s| = |V_r + I·Z| by direct complex arithmetic", () => {
    // Independent check with complex numbers: Z = L·(r + jx), I = I_B·(cos φ − j sin φ).
    const r = 0.5e-3, x = 0.08e-3, L = 200, I = 300, cos = 0.8, sin = 0.6, V = 230;
    const zr = L * r, zx = L * x;
    const ir = I * cos, ii = -I * sin;
    const vsRe = V + (ir * zr - ii * zx);
    const vsIm = ir * zx + ii * zr;
    const expected = Math.hypot(vsRe, vsIm) - V;
    expect(voltageDropExact(1, r, x, L, I, cos, sin, V, false)).toBeCloseTo(expected, 12);
  });

  it("sending end given: solving for V_r and re-applying V_s = V_r + I·Z returns |V_s|", () => {
    const r = 1.2e-3, x = 0.08e-3, L = 150, I = 120, cos = 0.7, sin = Math.sqrt(1 - 0.49), V = 230;
    const d = voltageDropExact(2, r, x, L, I, cos, sin, V, true);
    const vr = V - d;
    expect(voltageDropExact(2, r, x, L, I, cos, sin, vr, false)).toBeCloseTo(d, 10);
  });

  it("DC: exact equals approximate (no reactive part)", () => {
    const r = voltageDrop({ system: "dc-2w", nominalVoltage_V: 24, current_A: 10, length_m: 20, area_m2: 2.5e-6 });
    expect(r.results.dropExact_V).toBeCloseTo(r.results.dropApprox_V, 12);
  });

  it("approximate and exact agree within 1 % of the drop when the drop is about 1 %", () => {
    const r = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 63, powerFactor: 0.85, length_m: 40, area_m2: 16e-6 });
    expect(r.results.dropExact_percent).toBeLessThan(2);
    expect(Math.abs(r.results.dropExact_V - r.results.dropApprox_V) / r.results.dropApprox_V).toBeLessThan(0.01);
  });

  it("feeder that cannot carry the current raises a named EngineError", () => {
    expect(() => voltageDrop({ system: "ac-1ph-2w", nominalVoltage_V: 230, current_A: 2000, powerFactor: 0.2, length_m: 2000, area_m2: 1.5e-6 })).toThrow(EngineError);
  });
});

describe("properties", () => {
  const cosArb = fc.double({ min: 0.2, max: 1, noNaN: true });
  it("exact ≥ approximate, and exceeds it by at most c²/(V − a) (both voltage ends)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-4, max: 2e-2, noNaN: true }), fc.double({ min: 0, max: 2e-4, noNaN: true }), fc.double({ min: 1, max: 300, noNaN: true }), fc.double({ min: 1, max: 200, noNaN: true }), cosArb, fc.boolean(), (r, x, L, I, cos, send) => {
        const sin = Math.sqrt(1 - cos * cos);
        const V = 230;
        const a = voltageDropApprox(1, r, x, L, I, cos, sin);
        fc.pre(a < 0.2 * V);
        const e = voltageDropExact(1, r, x, L, I, cos, sin, V, send);
        const c = L * I * (x * cos - r * sin);
        expect(e).toBeGreaterThanOrEqual(a - 1e-9);
        expect(e - a).toBeLessThanOrEqual((c * c) / (V - a) + 1e-9);
      }),
      { numRuns: 300 },
    );
  });

  it("approximate drop is proportional to length for a fixed current", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 1.1, max: 5, noNaN: true }), cosArb, (L, k, cos) => {
        const sin = Math.sqrt(1 - cos * cos);
        const u1 = voltageDropApprox(2, 1e-3, 0.08e-3, L, 50, cos, sin);
        const u2 = voltageDropApprox(2, 1e-3, 0.08e-3, k * L, 50, cos, sin);
        expect(u2 / u1).toBeCloseTo(k, 9);
      }),
      { numRuns: 200 },
    );
  });

  it("larger standard section → lower drop (same current, length, parallel count)", () => {
    const sizes = standardSizes("iec-60228");
    fc.assert(
      fc.property(fc.integer({ min: 0, max: sizes.length - 2 }), fc.double({ min: 5, max: 400, noNaN: true }), cosArb, fc.constantFrom("approximate", "exact"), (i, L, cos, method) => {
        const v = voltageDropInputSchema.parse({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 20, powerFactor: cos, length_m: L, area_m2: sizes[i]!.area_m2, method });
        const d1 = feederDropPercent(v, sizes[i]!.area_m2, true);
        const d2 = feederDropPercent(v, sizes[i + 1]!.area_m2, true);
        expect(d2).toBeLessThan(d1);
      }),
      { numRuns: 150 },
    );
  });
});

describe("conductor temperature, limits, minimum size, profile", () => {
  it("θ at load: θa + (θmax − θa)(I/Iz)² (common practice) — half load on PVC at 30 °C is 40 °C", () => {
    expect(conductorTemperatureAtLoad(30, 70, 50, 100)).toBeCloseTo(40, 12);
    const r = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 50, powerFactor: 0.9, length_m: 50, area_m2: 16e-6, insulation: "pvc", ampacity_A: 100 });
    expect(r.results.conductorTemperature_C).toBeCloseTo(40, 9);
    expect(r.results.temperatureBasis).toMatch(/load current/);
    const rMax = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 50, powerFactor: 0.9, length_m: 50, area_m2: 16e-6, insulation: "pvc" });
    expect(rMax.results.conductorTemperature_C).toBe(70);
    // R ratio (β + 70)/(β + 40) for copper, β = 234.5 (IEC 60949 Table I); the skin effect of 16 mm²
    // (y_s ≈ 1e-4, changing with R) moves the ratio by about 1e-5, inside the tolerance of ±5e-5.
    expect(rMax.results.resistance_ohm_per_m / r.results.resistance_ohm_per_m).toBeCloseTo((234.5 + 70) / (234.5 + 40), 4);
  });

  it("IEC 60364-5-52 Annex G long-run supplement: +0.005 %/m beyond 100 m, at most +0.5 %", () => {
    expect(applicableLimitPercent("iec-a-other", 80).percent).toBe(5);
    expect(applicableLimitPercent("iec-a-other", 150).percent).toBeCloseTo(5.25, 12);
    expect(applicableLimitPercent("iec-a-lighting", 400).percent).toBeCloseTo(3.5, 12);
    expect(applicableLimitPercent("nec-feeder", 400).percent).toBe(3);
  });

  it("organisation override replaces the table limit and the check uses it", () => {
    const r = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 100, powerFactor: 0.85, length_m: 100, area_m2: 25e-6, limitPercent: 2 });
    expect(r.results.limit_percent).toBe(2);
    expect(r.checks[0]!.limit).toBe(2);
    expect(r.checks[0]!.pass).toBe(r.results.drop_percent <= 2);
  });

  it("minimum standard size meets the limit and the next smaller size does not", () => {
    const input = { system: "ac-3ph-4w" as const, nominalVoltage_V: 400, current_A: 80, powerFactor: 0.85, length_m: 180, area_m2: 10e-6, limitId: "iec-a-lighting" as const };
    const r = voltageDrop(input);
    const m = r.results.minimumSize!;
    expect(m.drop_percent).toBeLessThanOrEqual(r.results.limit_percent);
    const sizes = standardSizes("iec-60228");
    const i = sizes.findIndex((s) => s.area_m2 === m.area_m2);
    expect(i).toBeGreaterThan(0);
    const v = voltageDropInputSchema.parse(input);
    expect(feederDropPercent(v, sizes[i - 1]!.area_m2, true)).toBeGreaterThan(r.results.limit_percent);
  });

  it("parallel sets: n conductors of S give the drop of one conductor with R/n and X/n", () => {
    const one = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 600, powerFactor: 0.85, length_m: 60, area_m2: 240e-6, method: "approximate" });
    const two = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 600, powerFactor: 0.85, length_m: 60, area_m2: 240e-6, method: "approximate", parallel: 2 });
    expect(two.results.drop_V).toBeCloseTo(one.results.drop_V / 2, 9);
  });

  it("profile runs from the sending to the receiving voltage, falling for a lagging load", () => {
    const r = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 100, powerFactor: 0.8, length_m: 120, area_m2: 25e-6, profilePoints: 11 });
    const p = r.results.profile;
    expect(p).toHaveLength(11);
    expect(p[0]!.voltage_V).toBeCloseTo(r.results.sendingVoltage_V, 9);
    expect(p[10]!.voltage_V).toBeCloseTo(r.results.receivingVoltage_V, 9);
    expect(p[10]!.distance_m).toBe(120);
    for (let i = 1; i < p.length; i++) expect(p[i]!.voltage_V).toBeLessThan(p[i - 1]!.voltage_V);
    expect(r.results.sendingVoltage_V).toBeCloseTo(400, 9);
    expect(r.results.sendingVoltage_V - r.results.receivingVoltage_V).toBeCloseTo(r.results.drop_V, 9);
  });

  it("bad input names the field and the range", () => {
    try {
      voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 10, powerFactor: 1.5, length_m: 10, area_m2: 1e-6 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ZodError);
      const f = fieldErrors(e as ZodError);
      expect(f.powerFactor).toMatch(/Power factor.*0 to 1/);
    }
    const res = voltageDropInputSchema.safeParse({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 10, length_m: 10, area_m2: 1e-6, temperatureBasis: "given" });
    expect(res.success).toBe(false);
    if (!res.success) expect(fieldErrors(res.error).conductorTemperature_C).toMatch(/required/);
  });
});
