import { crossSectionLayout, type Segment, type TextMark } from "@/components/sheets/pictures/cross-section-layout";
import { pathSharesFromParallel, toPathShareRows, toTemperatureSeries, toVoltageSeries } from "@/components/sheets/pictures/series";
import type { UnitSystem } from "@/db/schema/projects";
import { sig } from "@/lib/engine/format";
import type { BarArrangement } from "@/lib/engine/geometry";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import { h, text, view, type PdfNode } from "./tree";
import { colour, font } from "./styles";

/**
 * Vector drawings for a sheet's PDF, from the same pure layout functions as the web
 * pictures: the busbar cross-section to scale, the temperature-against-current curve,
 * the voltage along a feeder and the current shares of parallel paths.
 */
const r2 = (x: number) => Math.round(x * 100) / 100;
/**
 * Line segments of one stroke style as a single path (one primitive for the library to
 * lay out and draw instead of one per segment; dashes restart on each segment as before).
 */
function lines(segs: Segment[], p: Record<string, unknown>): PdfNode | null {
  if (segs.length === 0) return null;
  return h("Path", { d: segs.map((s) => `M${r2(s.x1)} ${r2(s.y1)}L${r2(s.x2)} ${r2(s.y2)}`).join(""), fill: "none", ...p });
}

/** Filled polygons ("x,y x,y …" point lists) of one colour as a single path. */
function polygons(points: string[], p: Record<string, unknown>): PdfNode | null {
  if (points.length === 0) return null;
  const d = points.map((pts) => `M${pts.trim().split(/\s+/).map((xy) => xy.replace(",", " ")).join("L")}Z`).join("");
  return h("Path", { d, ...p });
}

function svgText(m: Pick<TextMark, "x" | "y" | "text" | "size" | "rotate" | "anchor">, p: Record<string, unknown> = {}): PdfNode {
  return h(
    "SvgText",
    {
      x: r2(m.x),
      y: r2(m.y),
      textAnchor: m.anchor ?? "middle",
      ...(m.rotate ? { transform: `rotate(${m.rotate}, ${r2(m.x)}, ${r2(m.y)})` } : {}),
      style: { fontSize: r2(m.size), fontFamily: font.sans },
      fill: colour.text,
      ...p,
    },
    m.text,
  );
}

function figure(caption: string, drawing: PdfNode): PdfNode {
  return h(
    "View",
    { wrap: false, style: { marginTop: 6, marginBottom: 4, borderWidth: 0.5, borderColor: colour.rule, padding: 6 } },
    drawing,
    text({ fontSize: 7.5, color: colour.muted, marginTop: 3 }, caption),
  );
}

export function isArrangement(v: unknown): v is BarArrangement {
  if (typeof v !== "object" || v === null) return false;
  const a = v as Record<string, unknown>;
  return ["barWidth_m", "barThickness_m", "barsPerPhase", "gap_m", "phases", "phaseSpacing_m"].every((k) => typeof a[k] === "number");
}

/** The bar arrangement of a sheet's inputs, wherever the kind keeps it. */
export function arrangementOf(inputs: Record<string, unknown>): BarArrangement | null {
  const conductor = inputs.conductor as Record<string, unknown> | undefined;
  for (const c of [inputs.arrangement, conductor?.arrangement]) if (isArrangement(c)) return c;
  return null;
}

export function crossSectionDrawing(arr: BarArrangement, units: UnitSystem, maxWidth = 500, maxHeight = 230): PdfNode {
  const L = crossSectionLayout(arr, { units });
  const vb = L.viewBox;
  const scale = Math.min(maxWidth / vb.w, maxHeight / vb.h);
  const hair = 0.08 * L.u;
  const svg = h(
    "Svg",
    { width: r2(vb.w * scale), height: r2(vb.h * scale), viewBox: `${r2(vb.x)} ${r2(vb.y)} ${r2(vb.w)} ${r2(vb.h)}` },
    L.bars.map((b) => h("Rect", { x: r2(b.x), y: r2(b.y), width: r2(b.w), height: r2(b.h), fill: colour.metal, stroke: colour.metalEdge, strokeWidth: r2(0.12 * L.u) })),
    lines(L.centreLines, { stroke: colour.faint, strokeWidth: r2(hair), strokeDasharray: `${r2(1.6 * L.u)} ${r2(0.5 * L.u)}` }),
    lines(
      L.dimensions.flatMap((d) => [...d.extensions, d.line, ...d.tails]),
      { stroke: colour.muted, strokeWidth: r2(hair) },
    ),
    polygons(
      L.dimensions.flatMap((d) => d.arrows),
      { fill: colour.muted },
    ),
    L.dimensions.map((d) => svgText(d.label)),
    L.phaseLabels.map((m) => svgText(m, { fontWeight: 600 })),
    L.scaleBar.segments.map((b, i) => h("Rect", { x: r2(b.x), y: r2(b.y), width: r2(b.w), height: r2(b.h), fill: i % 2 === 0 ? colour.text : colour.paper, stroke: colour.text, strokeWidth: r2(hair) })),
    L.scaleBar.labels.map((m) => svgText(m)),
  );
  return figure("Cross-section to scale: bars, centre lines, dimensions and a scale bar.", svg);
}

/** An axis tick without float noise or padding zeros ("0", "2.5", "1500"). */
const tick = (t: number) => String(Number(t.toPrecision(6)));

interface Axis {
  domain: [number, number];
  ticks: number[];
  title: string;
}

interface ChartSeries {
  points: { x: number; y: number }[];
  colour: string;
}

/** A line chart in points: axes with ticks, grid, one or more series, an optional horizontal limit. */
function lineChart(o: { x: Axis; y: Axis; series: ChartSeries[]; limit?: { y: number; label: string }; marks?: { x: number; y: number; label: string }[] }): PdfNode {
  const W = 500;
  const H = 200;
  const m = { l: 44, r: 12, t: 10, b: 30 };
  const pw = W - m.l - m.r;
  const ph = H - m.t - m.b;
  const [x0, x1] = o.x.domain;
  const [y0, y1] = o.y.domain;
  const X = (x: number) => r2(m.l + ((x - x0) / (x1 - x0 || 1)) * pw);
  const Y = (y: number) => r2(m.t + ph - ((y - y0) / (y1 - y0 || 1)) * ph);
  const label = (x: number, y: number, t: string, anchor: "start" | "middle" | "end", extra: Record<string, unknown> = {}) =>
    h("SvgText", { x, y, textAnchor: anchor, fill: colour.muted, style: { fontSize: 7, fontFamily: font.sans }, ...extra }, t);
  return h(
    "Svg",
    { width: W, height: H, viewBox: `0 0 ${W} ${H}` },
    lines(
      [...o.y.ticks.map((t) => ({ x1: m.l, x2: m.l + pw, y1: Y(t), y2: Y(t) })), ...o.x.ticks.map((t) => ({ x1: X(t), x2: X(t), y1: m.t, y2: m.t + ph }))],
      { stroke: colour.grid, strokeWidth: 0.5 },
    ),
    h("Rect", { x: m.l, y: m.t, width: pw, height: ph, fill: "none", stroke: colour.axis, strokeWidth: 0.75 }),
    o.y.ticks.map((t) => label(m.l - 4, Y(t) + 2.5, tick(t), "end")),
    o.x.ticks.map((t) => label(X(t), m.t + ph + 10, tick(t), "middle")),
    label(m.l + pw / 2, H - 4, o.x.title, "middle", { fill: colour.text }),
    label(10, m.t + ph / 2, o.y.title, "middle", { fill: colour.text, transform: `rotate(-90, 10, ${r2(m.t + ph / 2)})` }),
    o.limit
      ? [
          h("Line", { x1: m.l, x2: m.l + pw, y1: Y(o.limit.y), y2: Y(o.limit.y), stroke: colour.fail, strokeWidth: 0.9, strokeDasharray: "4 2" }),
          label(m.l + pw - 3, Y(o.limit.y) - 3, o.limit.label, "end", { fill: colour.fail }),
        ]
      : null,
    o.series.map((s) => h("Polyline", { points: s.points.map((p) => `${X(p.x)},${Y(p.y)}`).join(" "), fill: "none", stroke: s.colour, strokeWidth: 1.4 })),
    (o.marks ?? []).flatMap((k) => {
      const nearRight = X(k.x) > m.l + pw * 0.7;
      return [h("Circle", { cx: X(k.x), cy: Y(k.y), r: 2.6, fill: colour.accent }), label(X(k.x) + (nearRight ? -5 : 5), Y(k.y) - 5, k.label, nearRight ? "end" : "start", { fill: colour.accent })];
    }),
  );
}

export function temperatureCurveDrawing(points: { current_A: number; temperature_C: number }[], units: UnitSystem, limit_C?: number, designCurrent_A?: number): PdfNode {
  const s = toTemperatureSeries(points, { limit_C, designCurrent_A, units });
  const marks = [
    ...(s.operating ? [{ x: s.operating.current, y: s.operating.temperature, label: `${sig(s.operating.current, 4)} A: ${sig(s.operating.temperature, 4)} ${s.tempUnit}` }] : []),
    ...(s.rating ? [{ x: s.rating.current, y: s.rating.temperature, label: `rating ${sig(s.rating.current, 4)} A` }] : []),
  ];
  const chart = lineChart({
    x: { domain: s.xDomain, ticks: s.xTicks, title: "Current (A)" },
    y: { domain: s.yDomain, ticks: s.yTicks, title: `Bar temperature (${s.tempUnit})` },
    series: [{ points: s.data.map((d) => ({ x: d.current, y: d.temperature })), colour: colour.series }],
    limit: s.limit !== undefined ? { y: s.limit, label: `limit ${sig(s.limit, 4)} ${s.tempUnit}` } : undefined,
    marks,
  });
  return figure("Bar temperature against current, with the temperature limit and the design point.", chart);
}

export function voltageProfileDrawing(points: { distance_m: number; voltage_V: number }[], units: UnitSystem, limitVoltage_V?: number): PdfNode {
  const s = toVoltageSeries(points, { limitVoltage_V, units });
  const chart = lineChart({
    x: { domain: s.xDomain, ticks: s.xTicks, title: `Distance along the route (${s.distUnit})` },
    y: { domain: s.yDomain, ticks: s.yTicks, title: "Voltage (V)" },
    series: [{ points: s.data.map((d) => ({ x: d.distance, y: d.voltage })), colour: colour.series }],
    limit: s.limit !== undefined ? { y: s.limit, label: `lowest allowed ${sig(s.limit, 4)} V` } : undefined,
    marks: s.receiving ? [{ x: s.receiving.distance, y: s.receiving.voltage, label: `${sig(s.receiving.voltage, 4)} V` }] : [],
  });
  return figure("Voltage along the feeder from the sending end to the load.", chart);
}

/** Horizontal bars: each path's current against its ampacity (tick), with its share. */
export function pathSharesDrawing(results: ParallelSharingResults, inputs: Record<string, unknown>): PdfNode {
  const rawPaths = Array.isArray(inputs.paths) ? (inputs.paths as { name: string; count?: number; ampacityPerConductor_A?: number }[]) : [];
  const { paths } = pathSharesFromParallel(results, rawPaths);
  const rows = toPathShareRows(paths);
  const max = Math.max(1, ...rows.flatMap((r) => [r.current, r.ampacity ?? 0])) * 1.1;
  const W = 500;
  const rowH = 18;
  const left = 110;
  const pw = W - left - 70;
  const H = rows.length * rowH + 10;
  const X = (a: number) => r2(left + (a / max) * pw);
  const svg = h(
    "Svg",
    { width: W, height: H, viewBox: `0 0 ${W} ${H}` },
    rows.map((r, i) => {
      const y = 5 + i * rowH;
      return h(
        "G",
        null,
        h("SvgText", { x: left - 6, y: y + 10, textAnchor: "end", fill: colour.text, style: { fontSize: 7.5, fontFamily: font.sans } }, r.name),
        h("Rect", { x: left, y: y + 2, width: r2(X(r.current) - left), height: rowH - 6, fill: r.overloaded ? colour.fail : colour.series }),
        r.ampacity !== undefined ? h("Line", { x1: X(r.ampacity), x2: X(r.ampacity), y1: y, y2: y + rowH - 2, stroke: colour.text, strokeWidth: 1.2 }) : null,
        h("SvgText", { x: X(Math.max(r.current, r.ampacity ?? 0)) + 4, y: y + 10, textAnchor: "start", fill: colour.muted, style: { fontSize: 7, fontFamily: font.sans } }, `${sig(r.current, 4)} A · ${sig(r.share * 100, 3)} %`),
      );
    }),
  );
  return figure("Current in each parallel path (bar) against the path's ampacity (tick), with its share of the total.", view({}, svg));
}
