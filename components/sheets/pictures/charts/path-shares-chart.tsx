"use client";

import { Bar, BarChart, CartesianGrid, LabelList, Rectangle, Tooltip, XAxis, YAxis, type BarShapeProps } from "recharts";
import { fixed } from "@/lib/engine/format";
import { amps, plain } from "../format-text";
import { ink } from "../palette";
import type { PathShareRow } from "../series";
import { axisLabel, axisLine, axisTick, gridProps, tooltipStyle } from "./chart-style";

export const pathColours = {
  normal: ink.series,
  within: ink.pass,
  over: ink.fail,
  contingency: ink.seriesSoft,
  contingencyOver: "#f0a3a3",
  ampacity: ink.text,
} as const;

function rowOf(p: BarShapeProps): PathShareRow | undefined {
  return p.payload as PathShareRow | undefined;
}

/** Recharts body of PathShares; loaded on demand. */
export function PathSharesChart({ rows, xMax, xTicks, height, openPath }: { rows: PathShareRow[]; xMax: number; xTicks: number[]; height: number; openPath?: string }) {
  const withContingency = openPath !== undefined && rows.some((r) => r.contingency !== undefined);

  // The path's ampacity as a tick across each of its bars (placed on the bar's full-width background track).
  const ampacityTick = (p: BarShapeProps, row: PathShareRow | undefined) => {
    const bg = p.background;
    if (row?.ampacity === undefined || bg?.x == null || bg.width == null) return null;
    const x = bg.x + (bg.width * row.ampacity) / xMax;
    return <line x1={x} x2={x} y1={p.y - 3} y2={p.y + p.height + 3} stroke={pathColours.ampacity} strokeWidth={2.5} />;
  };
  const currentShape = (p: BarShapeProps) => {
    const row = rowOf(p);
    const fill = row?.overloaded ? pathColours.over : row?.ampacity !== undefined ? pathColours.within : pathColours.normal;
    return (
      <g>
        <Rectangle x={p.x} y={p.y} width={p.width} height={p.height} fill={fill} radius={[0, 2, 2, 0]} />
        {ampacityTick(p, row)}
      </g>
    );
  };
  const contingencyShape = (p: BarShapeProps) => {
    const row = rowOf(p);
    const over = row?.contingencyOverloaded;
    return (
      <g>
        <Rectangle x={p.x} y={p.y} width={p.width} height={p.height} fill={over ? pathColours.contingencyOver : pathColours.contingency} stroke={over ? ink.fail : "none"} radius={[0, 2, 2, 0]} />
        {ampacityTick(p, row)}
      </g>
    );
  };

  return (
    <BarChart responsive layout="vertical" data={rows} style={{ width: "100%", height }} margin={{ top: 8, right: 56, bottom: 22, left: 8 }} barGap={4} barCategoryGap="22%">
      <CartesianGrid {...gridProps} horizontal={false} />
      <XAxis type="number" domain={[0, xMax]} ticks={xTicks} tick={axisTick} axisLine={axisLine} tickLine={axisLine} tickFormatter={(v: number) => plain(v, 4)} label={axisLabel("Current (A)", "x")} />
      <YAxis type="category" dataKey="name" tick={axisTick} axisLine={axisLine} tickLine={false} width={96} />
      <Tooltip
        {...tooltipStyle}
        cursor={{ fill: ink.grid }}
        formatter={(v, name, item) => {
          const row = (item as { payload?: PathShareRow }).payload;
          if (name === "contingency") return [row?.isOpen ? "open" : amps(Number(v)), `With ${openPath} open`];
          const extra = row?.ampacity !== undefined ? ` of ${amps(row.ampacity)} (${fixed((row.utilisation ?? 0) * 100, 0)} %)` : "";
          return [`${amps(Number(v))}${extra}`, "Current"];
        }}
      />
      <Bar dataKey="current" name="current" shape={currentShape} background={{ fill: "transparent" }} isAnimationActive={false}>
        <LabelList dataKey="share" position="right" fontSize={11} fill={ink.muted} formatter={(v: unknown) => `${fixed(Number(v) * 100, 0)} %`} />
      </Bar>
      {withContingency && (
        <Bar dataKey="contingency" name="contingency" shape={contingencyShape} background={{ fill: "transparent" }} isAnimationActive={false}>
          <LabelList
            dataKey="contingency"
            position="right"
            fontSize={11}
            fill={ink.muted}
            formatter={(v: unknown) => (Number(v) === 0 ? "open" : amps(Number(v)))}
          />
        </Bar>
      )}
    </BarChart>
  );
}
