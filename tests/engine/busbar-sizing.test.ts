import { describe, expect, it } from "vitest";
import { busbarSizingSchema, calcBusbarSizing, flatBarSizes } from "../../lib/engine/busbar-sizing";
import { calcBusbarRating } from "../../lib/engine/busbar-thermal";
import { fieldErrors } from "../../lib/engine/core/schema";
import { material, resistivityAt } from "../../lib/engine/materials";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("busbar sizing", () => {
  const base = { current_A: 1250, ambient_C: 35, maxTemperature_C: 90, materialIds: ["cu-etp" as const], finish: "painted" as const, frequency_Hz: 50 };

  it("lists passing arrangements smallest section first, all within the limit; everything smaller that was met fails", () => {
    const r = calcBusbarSizing({ ...base, maxResults: 6 });
    expect(r.kind).toBe("busbar-sizing");
    const p = r.results.passing;
    expect(p.length).toBe(6);
    for (let i = 1; i < p.length; i++) expect(p[i]!.area_mm2).toBeGreaterThanOrEqual(p[i - 1]!.area_mm2);
    for (const c of p) {
      expect(c.temperature_C).toBeLessThanOrEqual(90);
      expect(c.ratedCurrent_A!).toBeGreaterThanOrEqual(1250);
      expect(c.reasons).toEqual([]);
    }
    for (const f of r.results.failing) {
      expect(f.pass).toBe(false);
      expect(f.reasons.length).toBeGreaterThan(0);
    }
    // The largest failing arrangement smaller than the first pass really is too hot (checked with the full rating calculation).
    const below = r.results.failing.find((f) => f.area_mm2 <= p[0]!.area_mm2)!;
    const check = calcBusbarRating({ arrangement: below.arrangement, materialId: "cu-etp", finish: "painted", ambient_C: 35, current_A: 1250, frequency_Hz: 50 });
    expect(check.results.temperature_C!).toBeGreaterThan(90 - 1); // 1 K allowance for the sizing's coarser filament mesh
  });

  it("the first pass agrees with the full rating calculation (60 filaments per bar) within 3 % of the temperature rise", () => {
    const r = calcBusbarSizing({ ...base, maxResults: 1 });
    const c = r.results.passing[0]!;
    const full = calcBusbarRating({ arrangement: c.arrangement, materialId: "cu-etp", finish: "painted", ambient_C: 35, current_A: 1250, frequency_Hz: 50 });
    expect(rel(c.temperature_C - 35, full.results.temperature_C! - 35)).toBeLessThan(0.03);
  });

  it("fault withstand: no passing section below S = I·√t/k with k = 159 A·√s/mm² (bare copper 30 → 200 °C, IEC 60364-5-54:2011 Table A.54.6 — from memory)", () => {
    const r = calcBusbarSizing({ ...base, current_A: 400, fault: { current_A: 50000, duration_s: 1, initialTemperature_C: 30, finalTemperature_C: 200 } });
    const sMin = 50000 / 159;
    const first = r.results.passing[0]!;
    expect(rel(first.faultMinSection_mm2!, sMin)).toBeLessThan(0.01);
    for (const c of r.results.passing) expect(c.area_mm2).toBeGreaterThanOrEqual(sMin * 0.99);
    expect(r.results.failing.some((f) => f.reasons.some((x) => /needed for 50000 A/.test(x)))).toBe(true);
    expect(r.checks.find((c) => c.id === "fault-section")!.pass).toBe(true);
  });

  it("voltage drop at DC by hand: ΔU% = 100·2·ρ(θ)/A·L·I/U (IEC 60364-5-52:2009 Annex G, b = 2 for a two-wire circuit)", () => {
    const r = calcBusbarSizing({ ...base, phases: 2, frequency_Hz: 0, maxResults: 3, voltageDrop: { length_m: 20, systemVoltage_V: 220, maxPercent: 5 } });
    for (const c of r.results.passing) {
      const rho = resistivityAt(material("cu-etp"), c.temperature_C);
      const byHand = (100 * 2 * (rho / (c.area_mm2 * 1e-6)) * 20 * 1250) / 220;
      expect(rel(c.voltageDrop_percent!, byHand)).toBeLessThan(1e-9);
    }
  });

  it("a tight voltage-drop limit pushes the choice to a larger section", () => {
    const loose = calcBusbarSizing({ ...base, maxResults: 1 });
    const tight = calcBusbarSizing({ ...base, maxResults: 1, voltageDrop: { length_m: 30, systemVoltage_V: 400, maxPercent: 0.5, powerFactor: 0.9 } });
    expect(tight.results.passing[0]!.area_mm2).toBeGreaterThan(loose.results.passing[0]!.area_mm2);
    expect(tight.results.passing[0]!.voltageDrop_percent!).toBeLessThanOrEqual(0.5);
  });

  it("aluminium needs a larger section than copper for the same duty (resistivity 2.83 vs 1.72 ×10⁻⁸ Ω·m, IEC 60287-1-1 Table 1)", () => {
    const cu = calcBusbarSizing({ ...base, maxResults: 1 });
    const al = calcBusbarSizing({ ...base, materialIds: ["al-1350"], maxResults: 1 });
    expect(al.results.passing[0]!.area_mm2).toBeGreaterThan(cu.results.passing[0]!.area_mm2);
  });

  it("warns when nothing passes, and reports the failures", () => {
    const r = calcBusbarSizing({ ...base, current_A: 40000, maxBarsPerPhase: 2 });
    expect(r.results.passing).toEqual([]);
    expect(r.warnings.some((w) => w.code === "no-arrangement-passes")).toBe(true);
    expect(r.results.failing.length).toBe(5);
  });

  it("reads the stock sizes of the flat-bar table", () => {
    expect(flatBarSizes("metric").some((s) => s.width_mm === 100 && s.thickness_mm === 10)).toBe(true);
    expect(flatBarSizes("inch").length).toBeGreaterThan(0);
  });

  it("bad input names the field", () => {
    const a = busbarSizingSchema.safeParse({ ...base, maxTemperature_C: 20 });
    expect(fieldErrors(a.error!)["maxTemperature_C"]).toMatch(/above the ambient/);
    const b = busbarSizingSchema.safeParse({ ...base, materialIds: [] });
    expect(fieldErrors(b.error!)["materialIds"]).toMatch(/at least one/);
    const c = busbarSizingSchema.safeParse({ ...base, current_A: "lots" });
    expect(fieldErrors(c.error!)["current_A"]).toMatch(/Required current must be a number from 1 to 50000 A/);
    const d = busbarSizingSchema.safeParse({ ...base, fault: { current_A: 10000, duration_s: 1, finalTemperature_C: 80 } });
    expect(fieldErrors(d.error!)["fault.finalTemperature_C"]).toMatch(/above the start temperature/);
  });
});
