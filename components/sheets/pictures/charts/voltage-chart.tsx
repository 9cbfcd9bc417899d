"use client";

import { CartesianGrid, LabelList, Line, LineChart, ReferenceDot, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { fixed } from "@/lib/engine/format";
import { plain } from "../format-text";
import { ink } from "../palette";
import type { VoltageSeries } from "../series";
import { namedPointDot } from "./named-point-dot";
import { gridProps, numericAxis, tooltipStyle } from "./chart-style";

/** Recharts body of VoltageProfile; loaded on demand. */
export function VoltageChart({ series: s, height }: { series: VoltageSeries; height: number }) {
  const end = s.receiving;
  const endColour = s.withinLimit === false ? ink.fail : s.withinLimit ? ink.pass : ink.accent;
  // Only named points (boards, junctions) get a dot; the line itself carries the rest.
  const dot = namedPointDot<{ label?: string }>((p) => Boolean(p?.label));
  return (
    <LineChart responsive data={s.data} style={{ width: "100%", height }} margin={{ top: 22, right: 28, bottom: 22, left: 14 }}>
      <CartesianGrid {...gridProps} />
      <XAxis dataKey="distance" {...numericAxis(s.xDomain, s.xTicks, 4, `Distance (${s.distUnit})`, "x")} />
      <YAxis width={62} {...numericAxis(s.yDomain, s.yTicks, 5, "Voltage (V)", "y")} />
      <Tooltip
        {...tooltipStyle}
        labelFormatter={(v) => `${plain(Number(v), 4)} ${s.distUnit}`}
        formatter={(v) => [`${fixed(Number(v), 1)} V`, "Voltage"]}
      />
      {s.limit !== undefined && (
        <ReferenceLine
          y={s.limit}
          stroke={ink.fail}
          strokeDasharray="6 4"
          ifOverflow="extendDomain"
          label={{ value: `limit ${fixed(s.limit, 1)} V`, position: "insideBottomLeft", fill: ink.failDark, fontSize: 12 }}
        />
      )}
      {/* Linear between points: a feeder's drop grows evenly along it, points at one distance make a step. */}
      <Line type="linear" dataKey="voltage" stroke={ink.series} strokeWidth={2} dot={dot} activeDot={{ r: 4 }} isAnimationActive={false} name="Voltage">
        <LabelList dataKey="label" position="top" offset={8} fontSize={11} fill={ink.muted} />
      </Line>
      {end && (
        <ReferenceDot
          x={end.distance}
          y={end.voltage}
          r={5}
          fill={ink.accent}
          stroke={endColour}
          strokeWidth={2.5}
          label={{ value: `${fixed(end.voltage, 1)} V`, position: "bottom", offset: 10, fill: ink.text, fontSize: 12, fontWeight: 600 }}
        />
      )}
    </LineChart>
  );
}
