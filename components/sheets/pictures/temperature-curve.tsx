"use client";

import dynamic from "next/dynamic";
import { useMemo } from "react";
import { ChartFrame, ChartPlaceholder, LegendKey } from "./chart-frame";
import { ink } from "./palette";
import { temperatureSummary, toTemperatureSeries, type TemperaturePointIn } from "./series";
import type { PictureUnits } from "./units";

const HEIGHT = 300;

// The chart library loads with the first chart on a page, not with every page.
const TemperatureChart = dynamic(() => import("./charts/temperature-chart").then((m) => m.TemperatureChart), {
  ssr: false,
  loading: () => <ChartPlaceholder height={HEIGHT} />,
});

export interface TemperatureCurveProps {
  /** Steady conductor temperature against current (engine output: `temperatureCurve` or the rating's `curve`). */
  points: readonly TemperaturePointIn[];
  limit_C?: number;
  designCurrent_A?: number;
  units?: PictureUnits;
}

/** Temperature of the chosen bar against current, with the limit, the design current and the operating point. */
export function TemperatureCurve({ points, limit_C, designCurrent_A, units = "metric" }: TemperatureCurveProps) {
  const series = useMemo(() => toTemperatureSeries(points, { limit_C, designCurrent_A, units }), [points, limit_C, designCurrent_A, units]);
  const legend = (
    <>
      <LegendKey colour={ink.series} label="Steady temperature" shape="line" />
      {series.limit !== undefined && <LegendKey colour={ink.fail} label="Temperature limit" shape="dash" />}
      {series.designCurrent !== undefined && <LegendKey colour={ink.accent} label="Design current and operating point" shape="dash" />}
    </>
  );
  return (
    <ChartFrame caption={temperatureSummary(series)} legend={legend}>
      {series.data.length > 1 ? <TemperatureChart series={series} height={HEIGHT} /> : <ChartPlaceholderEmpty />}
    </ChartFrame>
  );
}

function ChartPlaceholderEmpty() {
  return <p className="text-sm text-fen-600">Not enough points to draw the curve.</p>;
}
