"use client";

import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { plain } from "../format-text";
import { networkInk } from "../network-layout";
import type { NetworkPathRow, NetworkPathSeries } from "../network-path-series";
import { ink } from "../palette";
import { namedPointDot } from "./named-point-dot";
import { gridProps, numericAxis, tooltipStyle } from "./chart-style";

/** Recharts body of NetworkPathVoltage; loaded on demand. */
export function NetworkPathChart({ series: s, height }: { series: NetworkPathSeries; height: number }) {
  const dot = namedPointDot<NetworkPathRow>((p) => Boolean(p?.node));
  return (
    <LineChart responsive data={s.rows} style={{ width: "100%", height }} margin={{ top: 22, right: 28, bottom: 22, left: 14 }}>
      <CartesianGrid {...gridProps} />
      <XAxis dataKey="distance" {...numericAxis(s.xDomain, s.xTicks, 4, `Distance from the supply (${s.distUnit})`, "x")} />
      <YAxis width={66} {...numericAxis(s.yDomain, s.yTicks, 6, "Voltage (V)", "y")} />
      <Tooltip
        {...tooltipStyle}
        labelFormatter={(v, payload) => {
          const node = (payload?.[0]?.payload as NetworkPathRow | undefined)?.node;
          return `${node ? `${node}, ` : ""}${plain(Number(v), 4)} ${s.distUnit}`;
        }}
        formatter={(v, name) => [`${plain(Number(v), 6)} V`, name === "dead" ? "Voltage (no current)" : "Voltage"]}
      />
      {s.nominal !== undefined && (
        <ReferenceLine
          y={s.nominal}
          stroke={ink.muted}
          strokeDasharray="3 3"
          ifOverflow="extendDomain"
          label={{ value: `supply ${plain(s.nominal, 5)} V`, position: "insideTopRight", fill: ink.muted, fontSize: 12 }}
        />
      )}
      {s.limit !== undefined && s.limitShown && (
        <ReferenceLine
          y={s.limit}
          stroke={ink.fail}
          strokeDasharray="6 4"
          ifOverflow="extendDomain"
          label={{ value: `drop limit ${plain(s.limit, 5)} V`, position: "insideBottomLeft", fill: ink.failDark, fontSize: 12 }}
        />
      )}
      {/* Linear between nodes: the drop grows evenly along a segment; a stretch without current stays flat. */}
      <Line type="linear" dataKey="live" name="live" stroke={ink.series} strokeWidth={2} dot={dot} activeDot={{ r: 4 }} connectNulls={false} isAnimationActive={false} />
      <Line type="linear" dataKey="dead" name="dead" stroke={networkInk.noCurrent} strokeWidth={2} strokeDasharray="5 4" dot={dot} connectNulls={false} isAnimationActive={false} />
    </LineChart>
  );
}
