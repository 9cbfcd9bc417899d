/**
 * Busbar heat balance benchmarks: temperature solves per second (goal ≤ 50 µs each),
 * current-at-limit evaluations, and full sizing runs (cold cache and warm cache).
 */
import { barCurrentForTemperature, barTemperatureForCurrent, prepareBusbar } from "../lib/engine/busbar-thermal";
import { calcBusbarSizing, clearSizingCache } from "../lib/engine/busbar-sizing";

function time(fn: () => void): number {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

export async function run(): Promise<void> {
  const prep = prepareBusbar({
    arrangement: { barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.08, orientation: "edge" },
    materialId: "cu-etp",
    emissivity: 0.4,
    ambient_C: 35,
    phaseIndex: 1,
    acRatio: 1.6,
  });
  let sink = 0;
  // Warm-up so the figures are for optimised code.
  for (let i = 0; i < 5000; i++) sink += barTemperatureForCurrent(prep, 500 + (i % 2500));
  const N = 50000;
  const ms = time(() => {
    for (let i = 0; i < N; i++) sink += barTemperatureForCurrent(prep, 500 + (i % 2500));
  });
  console.log(`busbar: temperature for current — ${((ms * 1000) / N).toFixed(1)} µs/solve, ${Math.round(N / (ms / 1000)).toLocaleString("en")} solves/s (goal ≤ 50 µs)`);
  const ms2 = time(() => {
    for (let i = 0; i < N; i++) sink += barCurrentForTemperature(prep, 40 + (i % 100));
  });
  console.log(`busbar: current for temperature — ${((ms2 * 1000) / N).toFixed(2)} µs/evaluation (explicit)`);

  const input = {
    current_A: 2500,
    ambient_C: 35,
    maxTemperature_C: 90,
    materialIds: ["cu-etp", "al-1350"] as ("cu-etp" | "al-1350")[],
    finish: "oxidised" as const,
    frequency_Hz: 50,
    voltageDrop: { length_m: 10, systemVoltage_V: 400, maxPercent: 1 },
    fault: { current_A: 50000, duration_s: 1, finalTemperature_C: 200 },
  };
  clearSizingCache();
  let evaluated = 0;
  let solves = 0;
  const cold = time(() => {
    const r = calcBusbarSizing(input);
    evaluated = r.results.evaluated;
    solves = r.results.filamentSolves;
  });
  const warm = time(() => void calcBusbarSizing(input));
  console.log(`busbar: sizing 2500 A, Cu + Al, 1–4 bars/phase — cold cache ${cold.toFixed(0)} ms (${evaluated} arrangements, ${solves} filament solves), warm cache ${warm.toFixed(0)} ms`);
  if (Number.isNaN(sink)) console.log("unexpected NaN");
}
