"use client";

import dynamic from "next/dynamic";
import { useMemo } from "react";
import { ChartFrame, ChartPlaceholder, LegendKey } from "./chart-frame";
import { ink } from "./palette";
import { toVoltageSeries, voltageSummary, type VoltagePointIn } from "./series";
import type { PictureUnits } from "./units";

const HEIGHT = 280;

const VoltageChart = dynamic(() => import("./charts/voltage-chart").then((m) => m.VoltageChart), {
  ssr: false,
  loading: () => <ChartPlaceholder height={HEIGHT} />,
});

export interface VoltageProfileProps {
  /** Voltage along the feeder or path, from the sending end; points may carry a name (a board, a junction). */
  points: readonly VoltagePointIn[];
  /** Lowest acceptable voltage (nominal less the permitted drop), V. */
  limitVoltage_V?: number;
  units?: PictureUnits;
}

/** Voltage against distance with the drop limit and the receiving-end value. */
export function VoltageProfile({ points, limitVoltage_V, units = "metric" }: VoltageProfileProps) {
  const series = useMemo(() => toVoltageSeries(points, { limitVoltage_V, units }), [points, limitVoltage_V, units]);
  const endColour = series.withinLimit === false ? ink.fail : series.withinLimit ? ink.pass : ink.accent;
  const legend = (
    <>
      <LegendKey colour={ink.series} label="Voltage" shape="line" />
      {series.limit !== undefined && <LegendKey colour={ink.fail} label="Lowest voltage allowed" shape="dash" />}
      <LegendKey colour={endColour} label={series.withinLimit === false ? "Receiving end: limit crossed" : "Receiving end"} />
    </>
  );
  return (
    <ChartFrame caption={voltageSummary(series)} legend={legend}>
      {series.data.length > 1 ? <VoltageChart series={series} height={HEIGHT} /> : <p className="text-sm text-fen-600">Not enough points to draw the profile.</p>}
    </ChartFrame>
  );
}
