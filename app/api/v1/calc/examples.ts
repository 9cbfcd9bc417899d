import type { CalcKindName } from "@/lib/engine";

/**
 * One valid input per calculation kind, in SI units: the request examples of the API
 * document and the inputs the API tests start from. Invented panel values, no project's data.
 */
const tinyTable = {
  name: "Workshop table, copper XLPE, method E",
  source: "Organisation practice (example)",
  rows: [
    { size_m2: 95e-6, material: "copper", insulation: "xlpe", installation: "E-3core", referenceAmbient_C: 30, conductorMax_C: 90, ampacity_A: 298 },
    { size_m2: 120e-6, material: "copper", insulation: "xlpe", installation: "E-3core", referenceAmbient_C: 30, conductorMax_C: 90, ampacity_A: 346 },
  ],
};

const threePhaseBars = { barWidth_m: 0.06, barThickness_m: 0.01, barsPerPhase: 1, gap_m: 0, phases: 3, phaseSpacing_m: 0.1, orientation: "edge" };

export const CALC_EXAMPLES: Record<CalcKindName, Record<string, unknown>> = {
  resistance: { conductor: { type: "bars", ...threePhaseBars }, materialId: "cu-etp", temperature_C: 90, frequency_Hz: 50, length_m: 10, parallel: 1 },
  "busbar-rating": { arrangement: threePhaseBars, materialId: "cu-etp", finish: "painted", ambient_C: 35, maxTemperature_C: 90, frequency_Hz: 50 },
  "busbar-sizing": { current_A: 1250, ambient_C: 35, maxTemperature_C: 90, materialIds: ["cu-etp"], finish: "painted", frequency_Hz: 50, maxResults: 3 },
  "voltage-drop": { system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 80, powerFactor: 0.85, length_m: 180, area_m2: 25e-6 },
  "cable-ampacity": { area_m2: 95e-6, insulation: "xlpe", cores: 3, ambient_C: 35 },
  "ampacity-table": { table: tinyTable, size_m2: 95e-6, material: "copper", insulation: "xlpe", installation: "E-3core", ambient_C: 40, grouping: { arrangement: "bunched", circuits: 2 } },
  "cable-sizing": { system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 120, powerFactor: 0.85, length_m: 60, insulation: "xlpe", installation: { source: "free-air", cores: 3 } },
  "parallel-sharing": {
    mode: "ac",
    current_A: 1600,
    ambient_C: 35,
    paths: [
      { name: "Riser A", materialId: "cu-etp", area_m2: 600e-6, length_m: 4.2, reactance_ohm_per_m: 0.00008, conductorTemperature_C: 70 },
      { name: "Riser B", materialId: "cu-etp", area_m2: 600e-6, length_m: 5.1, reactance_ohm_per_m: 0.00008, conductorTemperature_C: 70 },
    ],
  },
  "bus-network": {
    mode: "dc",
    conductors: [{ id: "main", materialId: "cu-etp", area_m2: 400e-6, conductorTemperature_C: 60 }],
    nodes: [{ id: "incomer" }, { id: "tap-1" }, { id: "tap-2" }],
    segments: [
      { id: "s1", from: "incomer", to: "tap-1", conductor: "main", length_m: 1.2 },
      { id: "s2", from: "tap-1", to: "tap-2", conductor: "main", length_m: 0.9 },
    ],
    supplies: [{ node: "incomer", voltage_V: 230 }],
    loads: [
      { node: "tap-1", current_A: 250 },
      { node: "tap-2", current_A: 160 },
    ],
  },
  "fault-withstand": {
    I_kA: 40,
    t_s: 1,
    materialId: "cu-etp",
    conductor: { type: "bars", arrangement: { barWidth_m: 0.08, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.12, orientation: "edge" } },
    span_m: 0.5,
  },
  "enclosure-heat": {
    width_m: 0.8,
    height_m: 2.0,
    depth_m: 0.6,
    ambient_C: 35,
    targetInternal_C: 40,
    losses: [
      { name: "Incoming breaker", loss_W: 85 },
      { name: "Main busbar", loss_W: 60, sourceSheet: "BB-01" },
    ],
  },
};
