"use client";

import { useState } from "react";
import { fixed, sig } from "@/lib/engine/format";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import type { UnitSystem } from "@/lib/sheets/units";
import { PathShares } from "@/components/sheets/pictures/path-shares";
import { contingencyTable, type ContingencyIn, type PathShareIn } from "@/components/sheets/pictures/series";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

/** Parallel sharing: current per path, with each path opened in turn. */
export function ParallelSharingKeyResults({ results: r, inputs, unitSystem }: { results: ParallelSharingResults; inputs: Record<string, unknown>; unitSystem: UnitSystem }) {
  const rawPaths = Array.isArray(inputs.paths) ? (inputs.paths as Record<string, unknown>[]) : [];
  const paths: PathShareIn[] = r.paths.map((p, i) => {
    const raw = rawPaths[i] ?? {};
    const per = typeof raw.ampacityPerConductor_A === "number" ? raw.ampacityPerConductor_A : undefined;
    const count = typeof raw.count === "number" ? raw.count : 1;
    return { name: p.name, current_A: p.current_A, share: p.share_pct / 100, ...(per !== undefined ? { ampacity_A: per * count } : {}) };
  });
  const contingency: ContingencyIn[] = r.contingencies.map((c) => ({ openPath: c.openPath, currents: r.paths.map((p) => c.paths.find((x) => x.name === p.name)?.current_A ?? 0) }));
  const table = contingencyTable(paths, contingency);
  // The engine names the worst case (its ranking is per conductor); the table highlights that one.
  const worstIndex = Math.max(0, table.rows.findIndex((c) => c.openPath === r.worstContingency.openPath));
  const worst = table.rows[worstIndex];
  const [openPath, setOpenPath] = useState<string | null>(r.worstContingency.openPath);
  // A rename or removal of the open path falls back to the worst case.
  const shown = openPath === null || contingency.some((c) => c.openPath === openPath) ? openPath : (worst?.openPath ?? null);

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
              <td>
                {p.name}
                {p.overloaded && <span className="ml-2 text-xs font-semibold text-signal-700">Overloaded</span>}
              </td>
              <td className="text-right tabular-nums">{fmt(p.current_A, "A", unitSystem)}</td>
              <td className="text-right tabular-nums">{sig(p.share_pct, 3)} %</td>
              <td className="text-right tabular-nums">{fmt(p.currentPerConductor_A, "A", unitSystem)}</td>
              <td className="text-right tabular-nums">{p.temperature_C === undefined ? "—" : fmt(p.temperature_C, "°C", unitSystem)}</td>
            </tr>
          ))}
        </tbody>
      </table>

      <section aria-labelledby="n1-heading" className="space-y-2">
        <h3 id="n1-heading" className="text-sm font-semibold text-fen-900">
          Each path open in turn
        </h3>
        <p className="text-sm text-fen-700" data-testid="worst-contingency">
          Worst case: <strong>{r.worstContingency.openPath}</strong> open
          {r.worstContingency.overloaded.length > 0 ? `, overloading ${r.worstContingency.overloaded.join(", ")}` : ", no path overloaded"}.
        </p>
        <table className="data-table" data-testid="contingency-table">
          <thead>
            <tr>
              <th>Open path</th>
              <th>Highest loaded remaining path</th>
              <th className="text-right">Its current</th>
              <th className="text-right">Of ampacity</th>
              <th>Result</th>
              <th>
                <span className="sr-only">Show</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {table.rows.map((c, k) => {
              const isWorst = k === worstIndex;
              return (
                <tr
                  key={c.openPath}
                  data-open-path={c.openPath}
                  data-worst={isWorst ? "" : undefined}
                  aria-current={c.openPath === shown ? "true" : undefined}
                  className={isWorst ? (c.verdict === "fail" ? "bg-signal-50 font-medium" : "bg-amberline-50 font-medium") : undefined}
                >
                  <td>
                    <div>{c.openPath}</div>
                    {isWorst && <span className="badge mt-1">Worst case</span>}
                  </td>
                  <td>{c.highest?.name ?? "—"}</td>
                  <td className="text-right tabular-nums">{c.highest ? fmt(c.highest.current, "A", unitSystem) : "—"}</td>
                  <td className="text-right tabular-nums">{c.highest?.utilisation !== undefined ? `${fixed(c.highest.utilisation * 100, 0)} %` : "—"}</td>
                  <td>
                    {c.verdict === "fail" ? (
                      <span className="font-semibold text-signal-700">Fail: {c.overloaded.join(", ")} overloaded</span>
                    ) : c.verdict === "pass" ? (
                      <span className="text-verdigris-700">Pass</span>
                    ) : (
                      <span className="text-fen-600">Not rated (no ampacity)</span>
                    )}
                  </td>
                  <td>
                    <button type="button" className="btn-secondary px-2 py-0.5 text-xs" onClick={() => setOpenPath(c.openPath)} disabled={c.openPath === shown} aria-label={`Show the case with ${c.openPath} open`}>
                      {c.openPath === shown ? "Shown" : "Show"}
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </section>
      <PathShares paths={paths} contingency={contingency} openPath={shown} onOpenPathChange={setOpenPath} />
    </div>
  );
}
