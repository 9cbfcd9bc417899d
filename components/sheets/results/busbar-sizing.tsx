"use client";

import type { BusbarSizingResults, SizingCandidate } from "@/lib/engine/busbar-sizing";
import { sig } from "@/lib/engine/format";
import { MATERIALS } from "@/lib/engine/materials";
import type { UnitSystem } from "@/lib/sheets/units";
import { fmt } from "./format";

const materialName = (id: string) => MATERIALS.find((m) => m.id === id)?.name ?? id;

function CandidateRows({ list, unitSystem, onPick, pickLabel }: { list: readonly SizingCandidate[]; unitSystem: UnitSystem; onPick?: (c: SizingCandidate) => void; pickLabel?: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="data-table">
        <thead>
          <tr>
            <th>Arrangement</th>
            <th className="text-right">Section</th>
            <th className="text-right">Temperature</th>
            <th className="text-right">Rating</th>
            <th className="text-right">Rac/Rdc</th>
            <th className="text-right">Loss</th>
            {onPick ? <th className="sr-only">Action</th> : null}
          </tr>
        </thead>
        <tbody>
          {list.map((c, i) => {
            const name = `${c.barsPerPhase} × ${c.size}`;
            return (
              <tr key={`${c.materialId}-${c.size}-${c.barsPerPhase}-${i}`} data-candidate={name}>
                <td>
                  <div className="font-medium text-fen-900">{name}</div>
                  <div className="max-w-40 truncate text-xs text-fen-500" title={materialName(c.materialId)}>
                    {materialName(c.materialId)}
                  </div>
                  {c.reasons.length > 0 ? <div className="text-xs text-signal-700">{c.reasons.join("; ")}</div> : null}
                </td>
                <td className="text-right tabular-nums">{fmt(c.area_mm2, "mm²", unitSystem)}</td>
                <td className="text-right tabular-nums">{fmt(c.temperature_C, "°C", unitSystem)}</td>
                <td className="text-right tabular-nums">{fmt(c.ratedCurrent_A, "A", unitSystem)}</td>
                <td className="text-right tabular-nums">{sig(c.acRatio, 3)}</td>
                <td className="text-right tabular-nums">{fmt(c.loss_W_m, "W/m", unitSystem)}</td>
                {onPick ? (
                  <td className="text-right">
                    <button type="button" className="btn-secondary whitespace-nowrap px-2 py-1 text-xs" onClick={() => onPick(c)}>
                      {pickLabel ?? "Use"}
                      <span className="sr-only"> this arrangement, {name}</span>
                    </button>
                  </td>
                ) : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** Busbar sizing: the arrangements that pass (to pick one from) and the nearest that fail. */
export function BusbarSizingKeyResults({
  results: r,
  unitSystem,
  onPick,
}: {
  results: BusbarSizingResults;
  unitSystem: UnitSystem;
  /** Offered when the user may add sheets: opens a busbar rating of the chosen arrangement. */
  onPick?: (c: SizingCandidate) => void;
}) {
  return (
    <div className="space-y-4">
      <section>
        <h3 className="mb-2 text-sm font-semibold text-fen-800">Arrangements that pass ({r.passing.length}), smallest first</h3>
        {r.passing.length > 0 ? (
          <CandidateRows list={r.passing} unitSystem={unitSystem} onPick={onPick} pickLabel="Rate" />
        ) : (
          <p className="text-sm text-signal-700">None of the arrangements searched passes every limit.</p>
        )}
      </section>
      {r.failing.length > 0 ? (
        <details className="rounded-md border border-fen-200 bg-white">
          <summary className="cursor-pointer px-3 py-2 text-sm font-semibold text-fen-800">Nearest arrangements that fail ({r.failing.length})</summary>
          <CandidateRows list={r.failing} unitSystem={unitSystem} />
        </details>
      ) : null}
      <p className="text-xs text-fen-500">
        {r.evaluated} arrangements evaluated, {r.filamentSolves} AC solves run.
      </p>
    </div>
  );
}
