import { plain } from "../format-text";
import { ink } from "../palette";

/** Shared look of the chart pictures: muted fen grid and axes, 12 px ticks. */
export const axisTick = { fontSize: 12, fill: ink.muted } as const;
export const axisLine = { stroke: ink.axis } as const;
export const gridProps = { stroke: ink.grid, strokeDasharray: "3 3" } as const;
export const axisLabel = (value: string, axis: "x" | "y") =>
  axis === "x"
    ? { value, position: "insideBottom" as const, offset: -4, fontSize: 12, fill: ink.text }
    : { value, angle: -90, position: "insideLeft" as const, offset: 10, fontSize: 12, fill: ink.text, style: { textAnchor: "middle" as const } };
export const tooltipStyle = {
  contentStyle: { borderRadius: 6, borderColor: ink.axis, fontSize: 12, color: ink.text },
  labelStyle: { color: ink.muted },
} as const;

/**
 * Props shared by the charts' numeric axes (spread onto XAxis or YAxis): the series'
 * domain and ticks, the common look, tick numbers to `digits` significant figures and
 * the axis title.
 */
export function numericAxis(domain: [number, number], ticks: number[], digits: number, title: string, axis: "x" | "y") {
  return {
    type: "number" as const,
    domain,
    ticks,
    tick: axisTick,
    axisLine,
    tickLine: axisLine,
    tickFormatter: (v: number) => plain(v, digits),
    label: axisLabel(title, axis),
  };
}
