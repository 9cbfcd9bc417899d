import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { EngineError } from "../../lib/engine/core/result";
import { ambientCorrectionFactor, ampacityFromTable, groupingFactor, parseAmpacityCsv, type AmpacityTable } from "../../lib/engine/ampacity-table";

const round2 = (x: number) => Math.round(x * 100) / 100;

describe("ambient correction k = √((θmax − θa)/(θmax − θref)) reproduces printed factors", () => {
  // IEC 60364-5-52:2009 Table B.52.14 (air, reference 30 °C) — printed values, from memory.
  const pvc: [number, number][] = [[10, 1.22], [15, 1.17], [20, 1.12], [25, 1.06], [35, 0.94], [40, 0.87], [45, 0.79], [50, 0.71], [55, 0.61], [60, 0.5]];
  const xlpe: [number, number][] = [[10, 1.15], [15, 1.12], [20, 1.08], [25, 1.04], [35, 0.96], [40, 0.91], [45, 0.87], [50, 0.82], [55, 0.76], [60, 0.71], [65, 0.65], [70, 0.58], [75, 0.5], [80, 0.41]];
  it("PVC (70 °C) column of Table B.52.14", () => {
    for (const [t, k] of pvc) expect(round2(ambientCorrectionFactor(70, t, 30)), `${t} °C`).toBe(k);
  });
  it("XLPE/EPR (90 °C) column of Table B.52.14", () => {
    for (const [t, k] of xlpe) expect(round2(ambientCorrectionFactor(90, t, 30)), `${t} °C`).toBe(k);
  });
  it("NEC Table 310.15(B)(1) (2020), 90 °C column, 36–40 °C row = 0.91 (from memory)", () => {
    expect(round2(ambientCorrectionFactor(90, 40, 30))).toBe(0.91);
  });
  it("ambient at the conductor limit gives 0", () => {
    expect(ambientCorrectionFactor(70, 70, 30)).toBe(0);
  });
});

describe("grouping factors, IEC 60364-5-52:2009 Table B.52.17 (from memory)", () => {
  it("bunched: 2 → 0.80, 3 → 0.70, 6 → 0.57, 9 → 0.50, 20 → 0.38", () => {
    expect(groupingFactor("bunched", 2)).toBe(0.8);
    expect(groupingFactor("bunched", 3)).toBe(0.7);
    expect(groupingFactor("bunched", 6)).toBe(0.57);
    expect(groupingFactor("bunched", 9)).toBe(0.5);
    expect(groupingFactor("bunched", 20)).toBe(0.38);
  });
  it("between columns the next larger count applies; single layers stop at nine", () => {
    expect(groupingFactor("bunched", 10)).toBe(0.45);
    expect(groupingFactor("single-layer-wall", 14)).toBe(0.7);
    expect(groupingFactor("bunched", 21)).toBeUndefined();
  });
});

describe("lookup in an organisation table", () => {
  // Example table shipped in reference-tables (IEC 60364-5-52 method E/F values, from memory).
  const table: AmpacityTable = parseAmpacityCsv("example", readFileSync(new URL("../../reference-tables/ampacity-example-table.csv", import.meta.url), "utf8"));

  it("applies ambient and grouping: XLPE 95 mm² method E, 298 A at 30 °C → 298·0.91·0.80 at 40 °C, 2 bunched", () => {
    const r = ampacityFromTable({ table, size_m2: 95e-6, material: "copper", insulation: "xlpe", installation: "E-3core", ambient_C: 40, grouping: { arrangement: "bunched", circuits: 2 } });
    expect(r.results.tabulated_A).toBe(298);
    expect(r.results.groupingFactor).toBe(0.8);
    expect(r.results.ambientFactor).toBeCloseTo(Math.sqrt(50 / 60), 12);
    expect(r.results.corrected_A).toBeCloseTo(298 * Math.sqrt(50 / 60) * 0.8, 9);
  });

  it("a given grouping factor wins and is reported", () => {
    const r = ampacityFromTable({ table, size_m2: 16e-6, material: "copper", insulation: "pvc", installation: "e-3core", ambient_C: 30, groupingFactor: 0.75 });
    expect(r.results.corrected_A).toBeCloseTo(80 * 0.75, 9);
    expect(r.results.groupingSource).toBe("given");
  });

  it("a missing row is a named EngineError", () => {
    expect(() => ampacityFromTable({ table, size_m2: 95e-6, material: "aluminium", insulation: "xlpe", installation: "E-3core", ambient_C: 30 })).toThrow(EngineError);
  });

  it("schema rejects a row without amps, naming the field", () => {
    expect(() => parseAmpacityCsv("bad", "size_mm2,label,material,insulation,installation,reference_ambient_C,conductor_max_C,ampacity_A\n10,,copper,pvc,E,30,70,-5")).toThrow(/Ampacity/);
  });
});
