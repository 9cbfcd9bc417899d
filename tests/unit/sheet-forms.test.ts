import { describe, expect, it } from "vitest";
import { isCalcKind, runCalc } from "@/lib/engine";
import { defaultInputs, SHEET_KINDS, suggestTag, type ProjectBasis } from "@/lib/sheets/kinds";
import { localiseMessage, toEngineInputs, toFormValues } from "@/lib/sheets/units";

const METRIC_IEC: ProjectBasis = { unitSystem: "metric", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, designAmbientC: 35, altitudeM: 40, standardFamily: "iec" };
const IMPERIAL_NA: ProjectBasis = { unitSystem: "imperial", systemVoltage: 480, systemType: "3ph-3w", frequency: 60, designAmbientC: 40, altitudeM: 300, standardFamily: "north-american" };
const DC: ProjectBasis = { ...METRIC_IEC, systemType: "dc", frequency: 0, systemVoltage: 110 };

describe("sheet kinds: starting inputs from the project", () => {
  for (const basis of [METRIC_IEC, IMPERIAL_NA, DC]) {
    for (const k of SHEET_KINDS.filter((x) => isCalcKind(x.kind))) {
      it(`${k.kind} (${basis.standardFamily}, ${basis.systemType}) computes without field errors`, () => {
        const out = runCalc(k.kind, defaultInputs(k.kind, basis));
        expect(out.ok ? "ok" : JSON.stringify(out.fields)).toBe("ok");
      });
    }
  }

  it("takes voltage, frequency and ambient from the project", () => {
    const vd = defaultInputs("voltage-drop", METRIC_IEC);
    expect(vd).toMatchObject({ nominalVoltage_V: 400, frequency_Hz: 50, ambient_C: 35, system: "ac-3ph-4w", limitId: "iec-a-other" });
    const br = defaultInputs("busbar-rating", IMPERIAL_NA);
    expect(br).toMatchObject({ frequency_Hz: 60, ambient_C: 40 });
    expect((br.arrangement as { phases: number }).phases).toBe(3);
    expect(defaultInputs("voltage-drop", DC)).toMatchObject({ system: "dc-2w", frequency_Hz: 0 });
  });

  it("suggests the next free tag", () => {
    expect(suggestTag("busbar-rating", [])).toBe("BR-01");
    expect(suggestTag("busbar-rating", ["BR-01", "br-02"])).toBe("BR-03");
  });
});

describe("sheet form units", () => {
  const stored = { arrangement: { barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.1, orientation: "edge" }, ambient_C: 35, current_A: 2000 };

  it("shows bar sizes in mm (metric) and inches (imperial), temperatures in °C or °F", () => {
    const m = toFormValues("busbar-rating", stored, "metric") as { arrangement: Record<string, string>; ambient_C: string };
    expect(m.arrangement.barWidth_m).toBe("100");
    expect(m.ambient_C).toBe("35");
    const i = toFormValues("busbar-rating", stored, "imperial") as { arrangement: Record<string, string>; ambient_C: string };
    expect(Number(i.arrangement.barWidth_m)).toBeCloseTo(100 / 25.4, 8);
    expect(i.ambient_C).toBe("95");
  });

  it("round-trips stored SI inputs through the displayed units without drift", () => {
    for (const system of ["metric", "imperial"] as const) {
      const back = toEngineInputs("busbar-rating", toFormValues("busbar-rating", stored, system), system);
      expect(back).toEqual(stored);
    }
  });

  it("converts typed values to SI, drops blanks, keeps unreadable text for the schema to name", () => {
    const si = toEngineInputs("busbar-rating", { arrangement: { barWidth_m: "120", gap_m: "" }, current_A: "abc", temperId: "R240" }, "metric");
    expect(si).toEqual({ arrangement: { barWidth_m: 0.12 }, current_A: "abc", temperId: "R240" });
    const out = runCalc("busbar-rating", si);
    expect(out.ok).toBe(false);
  });

  it("drops an optional group left blank (busbar sizing voltage-drop limit)", () => {
    expect(toEngineInputs("busbar-sizing", { current_A: "1600", voltageDrop: { length_m: "", maxPercent: "" } }, "metric")).toEqual({ current_A: 1600 });
  });

  it("reads imperial conductor sizes written the trade's way", () => {
    const si = toEngineInputs("voltage-drop", { area_m2: "4/0" }, "imperial") as { area_m2: number };
    expect(si.area_m2 * 1e6).toBeCloseTo(107.2, 1); // 4/0 AWG = 211.6 kcmil = 107.2 mm², ASTM B258
  });

  it("puts the engine's range messages into the user's units", () => {
    expect(localiseMessage("busbar-rating", "arrangement.barWidth_m", "Bar width must be from 0.003 to 0.4 m", "metric")).toBe("Bar width must be from 3 to 400 mm");
    expect(localiseMessage("busbar-rating", "maxTemperature_C", "Maximum bar temperature must be from -39 to 400 °C", "imperial")).toBe(
      "Maximum bar temperature must be from -38.2 to 752 °F",
    );
    expect(localiseMessage("voltage-drop", "area_m2", "Conductor cross-section is required (greater than 0 and up to 0.01 m²)", "metric")).toBe(
      "Conductor cross-section is required (greater than 0 and up to 10000 mm²)",
    );
    // Fields without a converted unit keep the message as the engine wrote it.
    expect(localiseMessage("busbar-rating", "frequency_Hz", "Frequency must be from 0 to 1000 Hz", "imperial")).toBe("Frequency must be from 0 to 1000 Hz");
  });
});
