"use client";

import dynamic from "next/dynamic";
import { useId, useMemo, useState } from "react";
import { fixed } from "@/lib/engine/format";
import { ChartFrame, ChartPlaceholder, LegendKey } from "./chart-frame";
import { amps, plain } from "./format-text";
import { ink } from "./palette";
import {
  pathCurrentAxis,
  pathSharesSummary,
  redistribution,
  redistributionSentence,
  toPathShareRows,
  worstContingencyIndex,
  type ContingencyIn,
  type PathShareIn,
  type RedistributionRow,
} from "./series";

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
  /** Controlled: the open path shown (null: normal operation only). With it, pass onOpenPathChange. */
  openPath?: string | null;
  onOpenPathChange?: (openPath: string | null) => void;
}

/** Current per parallel path against its ampacity, with an optional "path open" case beside it and where its current goes. */
export function PathShares({ paths, contingency, initialOpenPath, openPath, onOpenPathChange }: PathSharesProps) {
  const selectId = useId();
  const cases = contingency ?? [];
  const initial = initialOpenPath !== undefined ? cases.findIndex((c) => c.openPath === initialOpenPath) : worstContingencyIndex(paths, cases);
  const [own, setOwn] = useState<number>(initial);
  const controlled = openPath !== undefined;
  const chosen = controlled ? (openPath === null ? -1 : cases.findIndex((c) => c.openPath === openPath)) : own;
  const choose = (k: number) => {
    if (!controlled) setOwn(k);
    onOpenPathChange?.(k >= 0 ? (cases[k]?.openPath ?? null) : null);
  };
  const current = chosen >= 0 ? cases[chosen] : undefined;
  const rows = useMemo(() => toPathShareRows(paths, current), [paths, current]);
  const moved = useMemo(() => (current ? redistribution(paths, current) : []), [paths, current]);
  const axis = pathCurrentAxis(rows);
  const height = 48 + rows.length * (current ? 50 : 32);

  const controls =
    cases.length > 0 ? (
      <div>
        <label htmlFor={selectId} className="field-label">
          Compare with
        </label>
        <select id={selectId} className="field-input py-1.5" value={chosen} onChange={(e) => choose(Number(e.target.value))}>
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
    <div className="space-y-3">
      <ChartFrame caption={pathSharesSummary(rows, current?.openPath)} legend={legend} controls={controls}>
        {rows.length > 0 ? (
          <PathSharesChart rows={rows} xMax={axis.max} xTicks={axis.ticks} height={height} openPath={current?.openPath} />
        ) : (
          <p className="text-sm text-fen-600">No paths to draw.</p>
        )}
      </ChartFrame>
      {current && <Redistribution openPath={current.openPath} rows={moved} />}
    </div>
  );
}

/** Where the open path's current goes: before → after per path, and the paths that then exceed their ampacity, in words. */
function Redistribution({ openPath, rows }: { openPath: string; rows: readonly RedistributionRow[] }) {
  const over = rows.some((r) => r.overloaded);
  return (
    <div data-testid="redistribution" data-open-path={openPath} className="space-y-2">
      <p role="status" className={`rounded-md border px-3 py-2 text-sm ${over ? "border-signal-500/40 bg-signal-50 text-signal-700" : "border-fen-200 bg-fen-50 text-fen-800"}`}>
        {redistributionSentence(openPath, rows)}
      </p>
      <table className="data-table">
        <caption className="mb-1 text-left text-xs font-medium text-fen-700">Current per path with {openPath} open</caption>
        <thead>
          <tr>
            <th>Path</th>
            <th className="text-right">Before</th>
            <th className="text-right">After</th>
            <th className="text-right">Change</th>
            <th className="text-right">Of ampacity</th>
            <th>Status</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.name} data-path={r.name} data-overloaded={r.overloaded ? "" : undefined} className={r.overloaded ? "bg-signal-50" : r.isOpen ? "text-fen-500" : undefined}>
              <td>{r.name}</td>
              <td className="text-right tabular-nums">{amps(r.before)}</td>
              <td className="text-right tabular-nums">{r.isOpen ? "0 A" : amps(r.after)}</td>
              <td className="text-right tabular-nums">
                {r.isOpen ? "—" : `${r.increase >= 0 ? "+" : "−"}${plain(Math.abs(r.increase), 3)} A${r.increaseRatio !== undefined ? ` (${r.increaseRatio >= 0 ? "+" : "−"}${fixed(Math.abs(r.increaseRatio) * 100, 0)} %)` : ""}`}
              </td>
              <td className="text-right tabular-nums">{r.isOpen || r.afterUtilisation === undefined ? "—" : `${fixed(r.afterUtilisation * 100, 0)} %`}</td>
              <td>
                {r.isOpen ? (
                  "Open"
                ) : r.overloaded ? (
                  <span className="font-semibold text-signal-700">Overloaded</span>
                ) : r.ampacity !== undefined ? (
                  <span className="text-verdigris-700">Within ampacity</span>
                ) : (
                  "No ampacity given"
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
