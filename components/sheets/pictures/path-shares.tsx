"use client";

import dynamic from "next/dynamic";
import { useId, useMemo, useState } from "react";
import { ChartFrame, ChartPlaceholder, LegendKey } from "./chart-frame";
import { ink } from "./palette";
import { pathCurrentAxis, pathSharesSummary, toPathShareRows, worstContingencyIndex, type ContingencyIn, type PathShareIn } from "./series";

const PathSharesChart = dynamic(() => import("./charts/path-shares-chart").then((m) => m.PathSharesChart), {
  ssr: false,
  loading: () => <ChartPlaceholder height={160} />,
});

export interface PathSharesProps {
  paths: readonly PathShareIn[];
  /** "Each path open in turn": currents per path (in the order of `paths`) with one path open. */
  contingency?: readonly ContingencyIn[];
  /** Case shown first; default the one with the highest current over ampacity (or highest current). */
  initialOpenPath?: string;
}

/** Current per parallel path against its ampacity, with an optional "path open" case beside it. */
export function PathShares({ paths, contingency, initialOpenPath }: PathSharesProps) {
  const selectId = useId();
  const cases = contingency ?? [];
  const initial = initialOpenPath !== undefined ? cases.findIndex((c) => c.openPath === initialOpenPath) : worstContingencyIndex(paths, cases);
  const [chosen, setChosen] = useState<number>(initial);
  const current = chosen >= 0 ? cases[chosen] : undefined;
  const rows = useMemo(() => toPathShareRows(paths, current), [paths, current]);
  const axis = pathCurrentAxis(rows);
  const height = 48 + rows.length * (current ? 50 : 32);

  const controls =
    cases.length > 0 ? (
      <div>
        <label htmlFor={selectId} className="field-label">
          Compare with
        </label>
        <select id={selectId} className="field-input py-1.5" value={chosen} onChange={(e) => setChosen(Number(e.target.value))}>
          <option value={-1}>Normal operation only</option>
          {cases.map((c, k) => (
            <option key={c.openPath} value={k}>
              {c.openPath} open
            </option>
          ))}
        </select>
      </div>
    ) : undefined;

  const anyAmpacity = rows.some((r) => r.ampacity !== undefined);
  const legend = (
    <>
      <LegendKey colour={anyAmpacity ? ink.pass : ink.series} label={anyAmpacity ? "Current within ampacity" : "Current"} />
      {anyAmpacity && <LegendKey colour={ink.fail} label="Overloaded" />}
      {anyAmpacity && <LegendKey colour={ink.text} label="Ampacity" shape="tick" />}
      {current && <LegendKey colour={ink.seriesSoft} label={`With ${current.openPath} open`} />}
    </>
  );
  return (
    <ChartFrame caption={pathSharesSummary(rows, current?.openPath)} legend={legend} controls={controls}>
      {rows.length > 0 ? (
        <PathSharesChart rows={rows} xMax={axis.max} xTicks={axis.ticks} height={height} openPath={current?.openPath} />
      ) : (
        <p className="text-sm text-fen-600">No paths to draw.</p>
      )}
    </ChartFrame>
  );
}
