"use client";

import dynamic from "next/dynamic";
import { useId, useMemo, useState } from "react";
import type { NetworkInput, NetworkResults } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { ChartFrame, ChartPlaceholder, LegendKey } from "./chart-frame";
import { plain } from "./format-text";
import { networkInk } from "./network-layout";
import { loadChoices, networkPathSeries, networkPathSummary } from "./network-path-series";
import { ink } from "./palette";

const HEIGHT = 300;

// The chart library loads with the first chart on a page, not with every page.
const NetworkPathChart = dynamic(() => import("./charts/network-path-chart").then((m) => m.NetworkPathChart), {
  ssr: false,
  loading: () => <ChartPlaceholder height={HEIGHT} />,
});

export interface NetworkPathVoltageProps {
  input: NetworkInput;
  results: NetworkResults;
  unitSystem: UnitSystem;
}

/** Voltage along the route from the supply to a load the user picks (default: the load with the lowest voltage). */
export function NetworkPathVoltage({ input, results, unitSystem }: NetworkPathVoltageProps) {
  const selectId = useId();
  const choices = useMemo(() => loadChoices(input, results), [input, results]);
  const [wanted, setWanted] = useState<string | null>(null);
  // The user's pick while it is still a load; otherwise the lowest voltage (it follows edits).
  const fallback = choices[0]?.node ?? results.maxDrop?.node;
  const target = wanted !== null && choices.some((c) => c.node === wanted) ? wanted : fallback;
  const series = useMemo(() => (target ? networkPathSeries(input, results, target, unitSystem) : null), [input, results, target, unitSystem]);

  if (!target) return <p className="text-sm text-fen-600">The network has no load to draw a path to.</p>;

  const controls =
    choices.length > 0 ? (
      <div>
        <label htmlFor={selectId} className="field-label">
          Path to load
        </label>
        <select id={selectId} className="field-input py-1.5" value={target} onChange={(e) => setWanted(e.target.value)}>
          {choices.map((c, k) => (
            <option key={c.node} value={c.node}>
              {c.node}
              {c.voltage_V !== null ? ` — ${plain(c.voltage_V, 5)} V` : ""}
              {c.drop_pct !== null ? ` (drop ${plain(c.drop_pct, 2)} %)` : ""}
              {k === 0 && c.voltage_V !== null ? ", lowest" : ""}
            </option>
          ))}
        </select>
      </div>
    ) : undefined;

  if (!series || "error" in series) {
    return (
      <ChartFrame caption={series && "error" in series ? series.error : "No path to draw."} controls={controls}>
        <p className="text-sm text-fen-600" data-testid="network-path-plot">
          {series && "error" in series ? series.error : "No path to draw."}
        </p>
      </ChartFrame>
    );
  }
  const legend = (
    <>
      <LegendKey colour={ink.series} label="Voltage along the path" shape="line" />
      {series.deadSegments > 0 && <LegendKey colour={networkInk.noCurrent} label="No current (flat)" shape="dash" />}
      {series.nominal !== undefined && <LegendKey colour={ink.muted} label="Supply (nominal) voltage" shape="dash" />}
      {series.limit !== undefined &&
        (series.limitShown ? (
          <LegendKey colour={ink.fail} label="Lowest voltage the drop limit allows" shape="dash" />
        ) : (
          <span>Drop limit {plain(series.limit, 5)} V: below the plotted range</span>
        ))}
    </>
  );
  return (
    <ChartFrame caption={networkPathSummary(series)} legend={legend} controls={controls}>
      <div data-testid="network-path-plot" data-route={series.route.join(" ")}>
        {series.points.length > 1 ? <NetworkPathChart series={series} height={HEIGHT} /> : <p className="text-sm text-fen-600">The load is at the supply: no path to plot.</p>}
      </div>
    </ChartFrame>
  );
}
