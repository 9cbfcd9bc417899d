"use client";

import { useEffect, useRef, useState } from "react";
import type { FilamentDensity } from "@/lib/engine/filament";
import type { CalcReply, CalcRequest } from "@/lib/sheets/calc.worker";
import type { LiveOutcome } from "./safe-run";

/** Debounce of the live results after a keystroke, ms. */
export const LIVE_DEBOUNCE_MS = 150;

export interface LiveState {
  outcome: LiveOutcome | null;
  density?: FilamentDensity[];
  /** The inputs changed and their result has not arrived yet. */
  busy: boolean;
  /** Wall time of the last run, ms. */
  ms?: number;
}

interface Done {
  key: string;
  outcome: LiveOutcome;
  density?: FilamentDensity[];
  ms: number;
}

/**
 * Recomputes a sheet's results as its inputs change: debounced, and either in a web
 * worker (heavy kinds) or with the kind's own function in the page (cheap kinds). Only
 * the newest request's answer is kept. `inputsJson` is the engine inputs as JSON.
 */
export function useLiveCalc(opts: {
  kind: string;
  heavy: boolean;
  inputsJson: string;
  runHere?: (inputs: Record<string, unknown>) => LiveOutcome;
}): LiveState {
  const { kind, heavy, inputsJson, runHere } = opts;
  const [done, setDone] = useState<Done | null>(null);
  const workerRef = useRef<Worker | null>(null);
  const latest = useRef<{ id: number; key: string }>({ id: 0, key: "" });

  useEffect(() => {
    if (!heavy) return;
    const w = new Worker(new URL("../../../lib/sheets/calc.worker.ts", import.meta.url), { type: "module" });
    workerRef.current = w;
    w.onmessage = (e: MessageEvent<CalcReply>) => {
      if (e.data.id !== latest.current.id) return;
      setDone({ key: latest.current.key, outcome: e.data.outcome as LiveOutcome, density: e.data.density, ms: e.data.ms });
    };
    w.onerror = () =>
      setDone({ key: latest.current.key, outcome: { ok: false, fields: { _: "The live calculation stopped; save to have the server compute the result" } }, ms: 0 });
    return () => {
      w.terminate();
      workerRef.current = null;
    };
  }, [heavy]);

  useEffect(() => {
    const id = latest.current.id + 1;
    latest.current = { id, key: inputsJson };
    const timer = setTimeout(() => {
      const inputs = JSON.parse(inputsJson) as Record<string, unknown>;
      if (heavy) {
        const req: CalcRequest = { id, kind, inputs };
        workerRef.current?.postMessage(req);
      } else if (runHere) {
        const t0 = performance.now();
        const outcome = runHere(inputs);
        if (id === latest.current.id) setDone({ key: inputsJson, outcome, ms: performance.now() - t0 });
      }
    }, LIVE_DEBOUNCE_MS);
    return () => clearTimeout(timer);
  }, [inputsJson, kind, heavy, runHere]);

  return { outcome: done?.outcome ?? null, density: done?.density, busy: done?.key !== inputsJson, ms: done?.ms };
}
