"use client";

import { sig } from "@/lib/engine/format";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import type { UnitSystem } from "@/lib/sheets/units";
import { PathShares } from "@/components/sheets/pictures/path-shares";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

/** Parallel sharing: current per path, with each path opened in turn. */
export function ParallelSharingKeyResults({ results: r, inputs, unitSystem }: { results: ParallelSharingResults; inputs: Record<string, unknown>; unitSystem: UnitSystem }) {
  const rawPaths = Array.isArray(inputs.paths) ? (inputs.paths as Record<string, unknown>[]) : [];
  const paths = r.paths.map((p, i) => {
    const raw = rawPaths[i] ?? {};
    const per = typeof raw.ampacityPerConductor_A === "number" ? raw.ampacityPerConductor_A : undefined;
    const count = typeof raw.count === "number" ? raw.count : 1;
    return { name: p.name, current_A: p.current_A, share: p.share_pct / 100, ampacity_A: per !== undefined ? per * count : undefined };
  });
  const contingency = r.contingencies.map((c) => ({ openPath: c.openPath, currents: r.paths.map((p) => c.paths.find((x) => x.name === p.name)?.current_A ?? 0) }));
  return (
    <div className="space-y-4">
      <KeyValues
        items={[
          { label: "Voltage across the group", value: fmt(r.voltageDrop_V, "V", unitSystem) },
          { label: "Total loss", value: fmt(r.totalLoss_W, "W", unitSystem) },
          { label: "Equivalent impedance", value: `${sig(r.equivalentImpedance_ohm * 1000, 4)} mΩ` },
        ]}
      />
      <table className="data-table">
        <thead>
          <tr>
            <th>Path</th>
            <th className="text-right">Current</th>
            <th className="text-right">Share</th>
            <th className="text-right">Per conductor</th>
            <th className="text-right">Temperature</th>
          </tr>
        </thead>
        <tbody>
          {r.paths.map((p) => (
            <tr key={p.name} className={p.overloaded ? "bg-signal-50" : undefined}>
              <td>{p.name}</td>
              <td className="text-right tabular-nums">{fmt(p.current_A, "A", unitSystem)}</td>
              <td className="text-right tabular-nums">{sig(p.share_pct, 3)} %</td>
              <td className="text-right tabular-nums">{fmt(p.currentPerConductor_A, "A", unitSystem)}</td>
              <td className="text-right tabular-nums">{p.temperature_C === undefined ? "—" : fmt(p.temperature_C, "°C", unitSystem)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-sm text-fen-700">
        Worst case with a path open: <strong>{r.worstContingency.openPath}</strong> open
        {r.worstContingency.overloaded.length > 0 ? `, overloading ${r.worstContingency.overloaded.join(", ")}` : ", no path overloaded"}.
      </p>
      <PathShares paths={paths} contingency={contingency} initialOpenPath={r.worstContingency.openPath} />
    </div>
  );
}
