"use client";

import type { BusbarRatingResults } from "@/lib/engine/busbar-thermal";
import type { FilamentDensity } from "@/lib/engine/filament";
import type { BarArrangement } from "@/lib/engine/geometry";
import { sig } from "@/lib/engine/format";
import type { UnitSystem } from "@/lib/sheets/units";
import { BarCrossSection } from "@/components/sheets/pictures/bar-cross-section";
import { TemperatureCurve } from "@/components/sheets/pictures/temperature-curve";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

const PHASE = ["L1", "L2", "L3"];

/** Busbar rating: temperature, rating, losses and resistances, the cross-section and the temperature curve. */
export function BusbarRatingKeyResults({
  results: r,
  inputs,
  unitSystem,
  density,
}: {
  results: BusbarRatingResults;
  inputs: Record<string, unknown>;
  unitSystem: UnitSystem;
  density?: readonly FilamentDensity[];
}) {
  const arrangement = inputs.arrangement as BarArrangement | undefined;
  const frequency = typeof inputs.frequency_Hz === "number" ? inputs.frequency_Hz : 50;
  const limit = typeof inputs.maxTemperature_C === "number" ? inputs.maxTemperature_C : undefined;
  const current = typeof inputs.current_A === "number" ? inputs.current_A : undefined;
  return (
    <div className="space-y-4">
      <KeyValues
        items={[
          { label: "Bar temperature at the current", value: fmt(r.temperature_C, "°C", unitSystem), emphasis: true, testId: "result-temperature" },
          { label: "Rating at the temperature limit", value: fmt(r.ratedCurrent_A, "A", unitSystem), emphasis: true, testId: "result-rating" },
          { label: "Heat given off", value: fmt(r.loss_W_m, "W/m", unitSystem), testId: "result-loss" },
          { label: "Rdc at operating temperature", value: `${sig(r.rdc_ohm_m * 1e6, 4)} µΩ/m` },
          { label: "Rac at operating temperature", value: `${sig(r.rac_ohm_m * 1e6, 4)} µΩ/m` },
          { label: "Rac/Rdc", value: sig(r.acRatio, 4), testId: "result-ac-ratio" },
        ]}
      />
      <p className="text-xs text-fen-500">
        Losses and resistances of the governing phase ({PHASE[r.governingPhase] ?? r.governingPhase + 1}) at {fmt(r.operatingTemperature_C, "°C", unitSystem)}: convection{" "}
        {fmt(r.convection_W_m, "W/m", unitSystem)}, radiation {fmt(r.radiation_W_m, "W/m", unitSystem)}, emissivity {sig(r.emissivity, 3)}.
      </p>
      {r.perPhase.length > 1 ? (
        <table className="data-table">
          <thead>
            <tr>
              <th>Phase</th>
              <th className="text-right">Rac/Rdc</th>
              <th className="text-right">Temperature</th>
              <th className="text-right">Rating</th>
            </tr>
          </thead>
          <tbody>
            {r.perPhase.map((p) => (
              <tr key={p.phase}>
                <td>{PHASE[p.phase] ?? p.phase + 1}</td>
                <td className="text-right tabular-nums">{sig(p.acRatio, 4)}</td>
                <td className="text-right tabular-nums">{fmt(p.temperature_C, "°C", unitSystem)}</td>
                <td className="text-right tabular-nums">{fmt(p.ratedCurrent_A, "A", unitSystem)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      {arrangement ? (
        <figure className="rounded-md border border-fen-200 bg-white p-3">
          <BarCrossSection arrangement={arrangement} density={density} frequency_Hz={frequency > 0 ? frequency : undefined} units={unitSystem} />
          <figcaption className="mt-1 text-xs text-fen-500">
            Cross-section to scale{density ? ", coloured by AC current density" : ""}.
          </figcaption>
        </figure>
      ) : null}
      {r.curve.length > 1 ? <TemperatureCurve points={r.curve} limit_C={limit} designCurrent_A={current} units={unitSystem} /> : null}
    </div>
  );
}
