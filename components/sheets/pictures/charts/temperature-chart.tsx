"use client";

import { CartesianGrid, Line, LineChart, ReferenceDot, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { fixed } from "@/lib/engine/format";
import { amps } from "../format-text";
import { ink } from "../palette";
import type { TemperatureSeries } from "../series";
import { gridProps, numericAxis, tooltipStyle } from "./chart-style";

/** Recharts body of TemperatureCurve; loaded on demand. */
export function TemperatureChart({ series: s, height }: { series: TemperatureSeries; height: number }) {
  const verdict = s.operating?.withinLimit === undefined ? ink.accent : s.operating.withinLimit ? ink.pass : ink.fail;
  return (
    <LineChart responsive data={s.data} style={{ width: "100%", height }} margin={{ top: 18, right: 24, bottom: 22, left: 14 }}>
      <CartesianGrid {...gridProps} />
      <XAxis dataKey="current" {...numericAxis(s.xDomain, s.xTicks, 4, "Current (A)", "x")} />
      <YAxis width={58} {...numericAxis(s.yDomain, s.yTicks, 4, `Temperature (${s.tempUnit})`, "y")} />
      <Tooltip
        {...tooltipStyle}
        labelFormatter={(v) => amps(Number(v))}
        formatter={(v) => [`${fixed(Number(v), 1)} ${s.tempUnit}`, "Temperature"]}
      />
      {s.limit !== undefined && (
        <ReferenceLine
          y={s.limit}
          stroke={ink.fail}
          strokeDasharray="6 4"
          ifOverflow="extendDomain"
          label={{ value: `limit ${fixed(s.limit, 0)} ${s.tempUnit}`, position: "insideTopLeft", fill: ink.failDark, fontSize: 12 }}
        />
      )}
      {s.designCurrent !== undefined && (
        <ReferenceLine
          x={s.designCurrent}
          stroke={ink.accent}
          strokeDasharray="4 3"
          ifOverflow="extendDomain"
          label={{ value: `design ${amps(s.designCurrent)}`, position: "insideBottomRight", fill: ink.accent, fontSize: 12, offset: 8 }}
        />
      )}
      <Line type="monotone" dataKey="temperature" stroke={ink.series} strokeWidth={2} dot={false} isAnimationActive={false} name="Temperature" />
      {s.rating && (
        <ReferenceDot
          x={s.rating.current}
          y={s.rating.temperature}
          r={4}
          fill={ink.paper}
          stroke={ink.failDark}
          strokeWidth={2}
          label={{ value: `reaches limit ≈ ${amps(s.rating.current)}`, position: "right", dy: 14, fill: ink.failDark, fontSize: 12 }}
        />
      )}
      {s.operating && (
        <ReferenceDot
          x={s.operating.current}
          y={s.operating.temperature}
          r={6}
          fill={ink.accent}
          stroke={verdict}
          strokeWidth={3}
          label={{ value: `${fixed(s.operating.temperature, 1)} ${s.tempUnit}`, position: "left", fill: ink.text, fontSize: 12, fontWeight: 600, offset: 10 }}
        />
      )}
    </LineChart>
  );
}
