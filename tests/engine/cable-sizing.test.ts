import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { cableSizing } from "../../lib/engine/cable-sizing";
import { cableAmpacity } from "../../lib/engine/cable-ampacity";
import { parseAmpacityCsv } from "../../lib/engine/ampacity-table";

// Organisation table: IEC 60364-5-52 method E/F copper values (from memory), shipped as an example.
const table = parseAmpacityCsv("example", readFileSync(new URL("../../reference-tables/ampacity-example-table.csv", import.meta.url), "utf8"));
const base = { system: "ac-3ph-4w" as const, nominalVoltage_V: 400, powerFactor: 0.85, insulation: "xlpe" as const };

describe("cable sizing from an organisation table", () => {
  it("short run: capacity governs — 110 A needs 25 mm² (127 A); 16 mm² carries only 100 A", () => {
    const r = cableSizing({ ...base, current_A: 110, length_m: 10, installation: { source: "table", table, installation: "E-3core" } });
    const s = r.results.selected!;
    expect(s.parallel).toBe(1);
    expect(s.area_m2).toBeCloseTo(25e-6, 12);
    expect(s.ampacity_A).toBe(127);
    expect(s.governedBy).toBe("ampacity");
    expect(s.ampacityMargin).toBeCloseTo((127 - 110) / 127, 12);
    expect(r.checks.every((c) => c.pass)).toBe(true);
  });

  it("long run: drop governs — the selected size meets 5 %, the next smaller one does not", () => {
    const r = cableSizing({ ...base, current_A: 50, length_m: 300, installation: { source: "table", table, installation: "E-3core" } });
    const s = r.results.selected!;
    expect(s.governedBy).toBe("voltage drop");
    expect(s.drop_percent).toBeLessThanOrEqual(r.results.limit_percent);
    // IEC 60364-5-52 Annex G supplement: 300 m → 5 % + min(0.5, 0.005·200) = 5.5 %
    expect(r.results.limit_percent).toBeCloseTo(5.5, 12);
    const smaller = cableSizing({ ...base, current_A: 50, length_m: 300, maxSize_m2: s.area_m2 * 0.99, maxParallel: 1, installation: { source: "table", table, installation: "E-3core" } });
    expect(smaller.results.selected).toBeNull();
  });

  it("a size cap forces parallel conductors: 900 A with at most 240 mm² → 2 × 185 mm² (2 × 456 A)", () => {
    const r = cableSizing({ ...base, current_A: 900, length_m: 20, maxSize_m2: 240e-6, installation: { source: "table", table, installation: "E-3core" } });
    const s = r.results.selected!;
    expect(s.parallel).toBe(2);
    expect(s.area_m2).toBeCloseTo(185e-6, 12);
    expect(s.ampacity_A).toBe(912);
    expect(r.warnings.map((w) => w.code)).toContain("parallel");
    // Candidates list the smallest passing size for each n, sizes not increasing with n.
    for (let i = 1; i < r.results.candidates.length; i++) expect(r.results.candidates[i]!.area_m2).toBeLessThanOrEqual(r.results.candidates[i - 1]!.area_m2);
  });

  it("ambient correction moves the boundary: 110 A → 25 mm² at 40 °C, 35 mm² at 50 °C", () => {
    // k = √(50/60) = 0.9129 (IEC 60364-5-52 Table B.52.14 basis): 25 mm² → 127·0.9129 = 115.9 A ≥ 110.
    const at40 = cableSizing({ ...base, current_A: 110, length_m: 10, ambient_C: 40, installation: { source: "table", table, installation: "E-3core" } });
    expect(at40.results.selected!.area_m2).toBeCloseTo(25e-6, 12);
    const at50 = cableSizing({ ...base, current_A: 110, length_m: 10, ambient_C: 50, installation: { source: "table", table, installation: "E-3core" } });
    // k = √(40/60) = 0.8165: 25 mm² → 103.7 A < 110, 35 mm² → 129.0 A.
    expect(at50.results.selected!.area_m2).toBeCloseTo(35e-6, 12);
  });
});

describe("cable sizing in free air (IEC 60287)", () => {
  it("the selected size's capacity equals the IEC 60287 rating of that size and carries the load", () => {
    const r = cableSizing({ ...base, current_A: 250, length_m: 40, installation: { source: "free-air", cores: 1, arrangement: "trefoil" } });
    const s = r.results.selected!;
    const rating = cableAmpacity({ area_m2: s.area_m2, insulation: "xlpe", cores: 1, arrangement: "trefoil" }).results.ampacity_A;
    expect(s.ampacityEach_A).toBeCloseTo(rating, 9);
    expect(s.ampacity_A).toBeGreaterThanOrEqual(250);
    // Next smaller standard size cannot carry 250 A (capacity-governed at 40 m).
    expect(s.governedBy).toBe("ampacity");
  });

  it("no candidate within the limits gives null and a warning", () => {
    const r = cableSizing({ ...base, current_A: 5000, length_m: 500, maxParallel: 2, installation: { source: "free-air", cores: 3 } });
    expect(r.results.selected).toBeNull();
    expect(r.warnings.map((w) => w.code)).toContain("no-candidate");
  });

  it("bad input names the field", () => {
    expect(() => cableSizing({ ...base, current_A: 100, length_m: 10, maxParallel: 9, installation: { source: "free-air" } })).toThrow(/Largest number in parallel/);
  });
});
