/// <reference lib="webworker" />
/**
 * Web worker for the sheet editor's live results of the kinds that can take longer than
 * a frame (busbar rating and sizing: the filament method, up to a few hundred ms).
 * It runs the engine's `runCalc`; for a busbar rating it also solves the current
 * density of the arrangement for the cross-section drawing.
 */
import { runCalc } from "../engine";
import { barArrangementAc, type FilamentDensity } from "../engine/filament";
import type { BarArrangement } from "../engine/geometry";

export interface CalcRequest {
  id: number;
  kind: string;
  inputs: unknown;
}

export interface CalcReply {
  id: number;
  outcome: ReturnType<typeof runCalc> | { ok: false; fields: Record<string, string> };
  /** Filament current densities of a busbar rating's arrangement (AC only). */
  density?: FilamentDensity[];
  ms: number;
}

/** Filaments per bar for the drawing: enough for a smooth colour map, quick to solve. */
const DRAWING_FILAMENTS_PER_BAR = 24;

function densityOf(inputs: unknown, rho: number | undefined): FilamentDensity[] | undefined {
  const v = inputs as { arrangement?: BarArrangement; frequency_Hz?: unknown };
  const f = Number(v.frequency_Hz ?? 50);
  if (!v.arrangement || !(f > 0) || !(rho && rho > 0)) return undefined;
  try {
    return barArrangementAc(v.arrangement, f, rho, { filamentsPerBar: DRAWING_FILAMENTS_PER_BAR }).density;
  } catch {
    return undefined;
  }
}

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (e: MessageEvent<CalcRequest>) => {
  const { id, kind, inputs } = e.data;
  const t0 = performance.now();
  let reply: CalcReply;
  try {
    const outcome = runCalc(kind, inputs);
    let density: FilamentDensity[] | undefined;
    if (outcome.ok && kind === "busbar-rating") {
      const rho = outcome.result.intermediates.rho?.value;
      // The engine has parsed the inputs: SI numbers, so the arrangement can be re-read as given.
      density = densityOf(inputs, rho);
    }
    reply = { id, outcome, density, ms: performance.now() - t0 };
  } catch (err) {
    reply = { id, outcome: { ok: false, fields: { _: err instanceof Error ? err.message : "The calculation failed" } }, ms: performance.now() - t0 };
  }
  scope.postMessage(reply);
};
