import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { EngineError } from "../../lib/engine/core/result";
import { parseAmpacityCsv } from "../../lib/engine/ampacity-table";
import { voltageDrop, voltageDropInputSchema, type VoltageDropInput } from "../../lib/engine/voltage-drop";
import { runCalc } from "../../lib/engine";

// The example table of reference-tables (IEC 60364-5-52 method E values, from memory):
// copper XLPE "E-3core": 95 mm² → 298 A at 30 °C reference, θ_max 90 °C.
const example = parseAmpacityCsv("example", readFileSync(new URL("../../reference-tables/ampacity-example-table.csv", import.meta.url), "utf8"));
const xlpeE = example.rows.filter((r) => r.material === "copper" && r.insulation === "xlpe" && r.installation === "E-3core");

const base: VoltageDropInput = {
  system: "ac-3ph-4w",
  nominalVoltage_V: 400,
  current_A: 180,
  powerFactor: 0.85,
  length_m: 80,
  area_m2: 95e-6,
  insulation: "xlpe",
  ambient_C: 40,
};
const snapshot = { id: 7, name: "Site code", version: 3, source: "illustrative", rows: xlpeE };

describe("feeder I_z from an organisation ampacity table", () => {
  it("I_z = n·I_tab·k_θ·k_g: 298 A · √(50/60) · 0.70 (3 bunched) · 2 in parallel", () => {
    // k_θ = √((90 − 40)/(90 − 30)) (IEC 60364-5-52 Table B.52.14 basis, 0.91 printed);
    // k_g = 0.70 for three circuits bunched (Table B.52.17 item 1, from memory).
    const r = voltageDrop({ ...base, parallel: 2, ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe", groupingArrangement: "bunched", circuits: 3 } });
    const expected = 2 * 298 * Math.sqrt(50 / 60) * 0.7;
    expect(r.results.tableAmpacity_A).toBeCloseTo(expected, 9);
    expect(r.results.ampacityTable?.title).toBe("Ampacity table Site code v3");
    expect(r.results.ampacityTable?.row.ampacity_A).toBe(298);
    expect(r.results.ampacityTable?.ambientFactor).toBeCloseTo(Math.sqrt(50 / 60), 12);
    expect(r.results.ampacityTable?.groupingFactor).toBe(0.7);
    expect(r.intermediates.Itab?.label).toContain("Ampacity table Site code v3");
    expect(r.intermediates.Iz?.value).toBeCloseTo(expected, 9);
    expect(r.formulas.map((f) => f.id)).toEqual(expect.arrayContaining(["iz-table", "k-theta", "k-group"]));
    expect(r.formulas.find((f) => f.id === "k-group")?.source).toMatch(/B\.52\.17.*from memory/);
  });

  it("the table's I_z sets the conductor temperature at the load, exactly as an entered I_z would", () => {
    const viaTable = voltageDrop({ ...base, ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe" } });
    const iz = viaTable.results.tableAmpacity_A!;
    const entered = voltageDrop({ ...base, ampacity_A: iz });
    expect(viaTable.results.conductorTemperature_C).toBeCloseTo(entered.results.conductorTemperature_C, 9);
    expect(viaTable.results.drop_percent).toBeCloseTo(entered.results.drop_percent, 12);
    // θ = θa + (θmax − θa)(I_B/I_z)² with I_z = 298·√(50/60)
    expect(viaTable.results.conductorTemperature_C).toBeCloseTo(40 + 50 * (180 / (298 * Math.sqrt(50 / 60))) ** 2, 9);
  });

  it("a load above the table's I_z is an overload warning", () => {
    const r = voltageDrop({ ...base, current_A: 400, ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe" } });
    expect(r.warnings.map((w) => w.code)).toContain("overload");
  });

  it("a size missing from the table is a message on the cross-section naming the sizes it has", () => {
    const rows = xlpeE.filter((r) => Math.abs(r.size_m2 - 95e-6) > 1e-9);
    try {
      voltageDrop({ ...base, ampacityFromTable: { table: { ...snapshot, rows }, installation: "E-3core", insulation: "xlpe" } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).field).toBe("area_m2");
      expect((e as EngineError).message).toMatch(/Ampacity table Site code v3 has no row for 95 mm².*its sizes are .*70 mm², 120 mm²/);
    }
    const out = runCalc("voltage-drop", { ...base, ampacityFromTable: { table: { ...snapshot, rows }, installation: "E-3core", insulation: "xlpe" } });
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.fields.area_m2).toMatch(/its sizes are/);
  });

  it("an aluminium conductor finds no copper rows and says so", () => {
    expect(() => voltageDrop({ ...base, materialId: "al-1350", ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe" } })).toThrow(/has no rows for aluminium XLPE/);
  });

  it("an entered I_z beside a table is not used, and the result says so", () => {
    const r = voltageDrop({ ...base, ampacity_A: 1000, ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe" } });
    expect(r.results.tableAmpacity_A).toBeCloseTo(298 * Math.sqrt(50 / 60), 9);
    expect(r.warnings.map((w) => w.code)).toContain("entered-ampacity-ignored");
  });

  it("a PVC row under an XLPE feeder is flagged", () => {
    const pvc = example.rows.filter((r) => r.insulation === "pvc" && r.installation === "E-3core" && r.material === "copper");
    const r = voltageDrop({ ...base, ampacityFromTable: { table: { ...snapshot, rows: pvc }, installation: "E-3core", insulation: "pvc" } });
    expect(r.warnings.map((w) => w.code)).toContain("table-insulation-mismatch");
  });

  it("the temperature basis 'load' is satisfied by a table alone", () => {
    const parsed = voltageDropInputSchema.safeParse({ ...base, temperatureBasis: "load", ampacityFromTable: { table: snapshot, installation: "E-3core", insulation: "xlpe" } });
    expect(parsed.success).toBe(true);
    expect(voltageDropInputSchema.safeParse({ ...base, temperatureBasis: "load" }).success).toBe(false);
  });

  it("a snapshot whose texts came back from a form as numbers still reads (installation 1, label 95)", () => {
    const rows = [{ ...xlpeE.find((r) => Math.abs(r.size_m2 - 95e-6) < 1e-9)!, label: 95 as unknown as string, installation: 1 as unknown as string }];
    const r = voltageDrop({ ...base, ampacityFromTable: { table: { ...snapshot, name: 2024 as unknown as string, rows }, installation: 1 as unknown as string, insulation: "xlpe" } });
    expect(r.results.ampacityTable?.title).toBe("Ampacity table 2024 v3");
    expect(r.results.ampacityTable?.rowLabel).toMatch(/^95 copper XLPE, installation 1/);
  });

  it("without a table nothing changes: no table fields in the result", () => {
    const r = voltageDrop(base);
    expect(r.results.ampacityTable).toBeUndefined();
    expect(r.results.tableAmpacity_A).toBeUndefined();
    expect(r.intermediates.Itab).toBeUndefined();
  });
});
