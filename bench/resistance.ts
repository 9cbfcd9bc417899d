/**
 * Filament-method timing: one 100 × 10 mm bar, and three phases of four such bars.
 */
import { barArrangementAc, DEFAULT_FILAMENTS_PER_BAR } from "../lib/engine/filament";
import type { BarArrangement } from "../lib/engine/geometry";

const RHO_CU_20 = 1.7241e-8;

function time(label: string, arr: BarArrangement, filamentsPerBar: number, repeats: number): void {
  barArrangementAc(arr, 50, RHO_CU_20, { filamentsPerBar }); // warm-up
  const t0 = performance.now();
  let r = barArrangementAc(arr, 50, RHO_CU_20, { filamentsPerBar });
  for (let i = 1; i < repeats; i++) r = barArrangementAc(arr, 50, RHO_CU_20, { filamentsPerBar });
  const ms = (performance.now() - t0) / repeats;
  console.log(
    `${label}: ${r.filamentCount} filaments (${r.mesh.nThickness}×${r.mesh.nWidth} per bar), ${ms.toFixed(1)} ms/solve, Rac/Rdc ${r.ratio.map((x) => x.toFixed(4)).join(" / ")}`,
  );
}

export async function run(): Promise<void> {
  const one: BarArrangement = { barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 1, gap_m: 0.01, phases: 1, phaseSpacing_m: 0, orientation: "edge" };
  const threeByFour: BarArrangement = { ...one, barsPerPhase: 4, phases: 3, phaseSpacing_m: 0.2 };
  time("filament: 1 bar 100×10 Cu, 50 Hz, default mesh", one, DEFAULT_FILAMENTS_PER_BAR, 20);
  time("filament: 1 bar 100×10 Cu, 50 Hz, fine mesh", one, 600, 3);
  time("filament: 3 phases × 4 bars 100×10 Cu, 50 Hz, default mesh", threeByFour, DEFAULT_FILAMENTS_PER_BAR, 5);
  time("filament: 3 phases × 4 bars 100×10 Cu, 50 Hz, 80/bar", threeByFour, 80, 2);
}

if (import.meta.url === `file://${process.argv[1]}`) void run();
