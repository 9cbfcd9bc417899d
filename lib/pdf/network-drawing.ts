import {
  colourScale,
  diagramFrame,
  layoutNetwork,
  modeAvailable,
  networkColour,
  networkInk,
  NETWORK_DRAW_LIMIT,
  nodeLabels,
  noCurrentMask,
  nominalVoltage,
  polylinePath,
  scaleGradient,
  scalePosition,
  segmentValues,
  toFrame,
  topologyOf,
  type ColourMode,
} from "@/components/sheets/pictures/network-layout";
import { loadChoices, networkPathSeries, networkPathSummary } from "@/components/sheets/pictures/network-path-series";
import type { UnitSystem } from "@/db/schema/projects";
import { sig } from "@/lib/engine/format";
import type { NetworkInput, NetworkResults } from "@/lib/engine/network";
import { voltageProfileDrawing } from "./drawings";
import { colour, font } from "./styles";
import { h, text, view, type PdfNode } from "./tree";

/**
 * The bus-network diagram for a sheet's PDF: the web picture's layout and colour scale
 * (network-layout.ts) as vector graphics, coloured by temperature rise (current density
 * when no rise is known), with its legend; then the voltage along the path to the load
 * with the lowest voltage. Segments of one colour share one path (the colour map is
 * quantised to 24 steps), so a network of thousands of segments stays a few hundred
 * primitives. Null when the network is too large to draw (the hottest list stands in).
 */
const WIDTH = 500;
const MAX_HEIGHT = 340;
const BINS = 24;

const r2 = (x: number) => Math.round(x * 100) / 100;

function figure(caption: string, ...drawing: PdfNode[]): PdfNode {
  return h(
    "View",
    { wrap: false, style: { marginTop: 6, marginBottom: 4, borderWidth: 0.5, borderColor: colour.rule, padding: 6 } },
    ...drawing,
    text({ fontSize: 7.5, color: colour.muted, marginTop: 3 }, caption),
  );
}

export function networkDrawing(inputs: Record<string, unknown>, results: NetworkResults, units: UnitSystem): PdfNode | null {
  const topo = topologyOf(inputs);
  if (topo.segments.length > NETWORK_DRAW_LIMIT || topo.nodes.length === 0 || !Array.isArray(results?.segments)) return null;
  const layout = layoutNetwork(topo);
  const f = diagramFrame(layout, topo.segments.length, { maxWidth: WIDTH, maxHeight: MAX_HEIGHT });
  const nominal = nominalVoltage(inputs);
  const mode: ColourMode = modeAvailable("rise", results, nominal) ? "rise" : "density";
  const values = segmentValues(mode, results, units, nominal);
  const scale = colourScale(mode, values, units);
  const dead = noCurrentMask(results);
  const index = new Map(results.segments.map((s, k) => [s.id, k]));

  // Group the strokes: one path per colour step, one for dead branches, one for overload halos.
  const groups = new Map<string, string[]>();
  const deadD: string[] = [];
  const overD: string[] = [];
  const unknownD: string[] = [];
  let noCurrent = 0;
  let over = 0;
  layout.segments.forEach((s) => {
    if (s.points.length < 2) return;
    const d = polylinePath(f, s.points);
    const k = index.get(s.id);
    const res = k === undefined ? undefined : results.segments[k];
    if (k === undefined || !res) {
      unknownD.push(d);
      return;
    }
    if (res.utilisation !== undefined && res.utilisation > 1) {
      overD.push(d);
      over++;
    }
    if (dead[k]) {
      deadD.push(d);
      noCurrent++;
      return;
    }
    const t = scalePosition(scale, values[k]!);
    if (Number.isNaN(t)) {
      unknownD.push(d);
      return;
    }
    const c = networkColour(Math.round(t * (BINS - 1)) / (BINS - 1));
    const list = groups.get(c) ?? [];
    list.push(d);
    groups.set(c, list);
  });
  const width = r2(Math.max(0.8, Math.min(2.6, f.rowGap * 0.25, f.colGap * 0.07)));
  const path = (d: string[], p: Record<string, unknown>) => (d.length ? h("Path", { d: d.join(""), fill: "none", strokeLinejoin: "round", ...p }) : null);

  const marks: PdfNode[] = [];
  const loadsD: string[] = [];
  const junctionD: string[] = [];
  const nodeR = Math.max(1, Math.min(2.6, f.rowGap * 0.18));
  const labels: PdfNode[] = [];
  layout.nodes.forEach((n) => {
    const [x, y] = toFrame(f, [n.x, n.y]);
    if (n.role === "supply") {
      const s = r2(Math.max(3.5, nodeR * 2.6));
      marks.push(h("Rect", { x: r2(x - s / 2), y: r2(y - s / 2), width: s, height: s, fill: colour.text }));
    } else {
      const q = nodeR;
      junctionD.push(`M${r2(x - q)} ${r2(y - q)}h${r2(2 * q)}v${r2(2 * q)}h${r2(-2 * q)}Z`);
      if (n.role === "load") {
        const a = q + 1.5;
        const L = Math.max(4, q * 2.4);
        loadsD.push(`M${r2(x + a)} ${r2(y - L * 0.45)}L${r2(x + a + L)} ${r2(y)}L${r2(x + a)} ${r2(y + L * 0.45)}Z`);
      }
    }
  });
  const placed = nodeLabels(layout, f, { fontSize: 7, nodeRadius: nodeR, loadMarker: Math.max(4, nodeR * 2.4) });
  placed.forEach((p) => {
    if (p) labels.push(h("SvgText", { x: r2(p.x), y: r2(p.y), textAnchor: p.anchor, fill: colour.text, style: { fontSize: 7, fontFamily: font.sans } }, p.text));
  });
  // Room on the left for the supply labels.
  const supplyRoom = f.labels ? Math.max(0, ...layout.nodes.filter((n) => n.role === "supply").map((n) => Math.min(18, n.id.length) * 4 + 8)) : 0;
  const vbX = -Math.max(0, supplyRoom - f.left);
  const vbW = f.width - vbX;
  const scaleDown = Math.min(1, WIDTH / vbW);
  const diagram = h(
    "Svg",
    { width: r2(vbW * scaleDown), height: r2(f.height * scaleDown), viewBox: `${r2(vbX)} 0 ${r2(vbW)} ${r2(f.height)}` },
    path(overD, { stroke: networkInk.overload, strokeOpacity: 0.45, strokeWidth: r2(width + 4.5), strokeLinecap: "round" }),
    path(deadD, { stroke: networkInk.noCurrent, strokeWidth: r2(Math.max(0.6, width * 0.6)), strokeDasharray: "3 2.4" }),
    path(unknownD, { stroke: networkInk.noValue, strokeWidth: width }),
    [...groups.entries()].map(([c, d]) => path(d, { stroke: c, strokeWidth: width, strokeLinecap: "round" })),
    junctionD.length ? h("Path", { d: junctionD.join(""), fill: colour.paper, stroke: colour.series, strokeWidth: 0.6 }) : null,
    loadsD.length ? h("Path", { d: loadsD.join(""), fill: colour.text }) : null,
    marks,
    labels,
  );

  // Legend: gradient with ticks in physical units, then the keys.
  const LW = 220;
  const steps = scaleGradient(scale, BINS);
  const lx = 4;
  const legend = h(
    "Svg",
    { width: WIDTH, height: 40, viewBox: `0 0 ${WIDTH} 40` },
    h("SvgText", { x: lx, y: 8, fill: colour.text, style: { fontSize: 7.5, fontFamily: font.sans, fontWeight: 600 } }, `${scale.title} (${scale.unit})`),
    steps.map((c, k) => h("Rect", { x: r2(lx + (k * LW) / steps.length), y: 12, width: r2(LW / steps.length + 0.3), height: 7, fill: c })),
    scale.ticks.map((t, i) =>
      h(
        "SvgText",
        { x: r2(lx + t.at * LW), y: 28, textAnchor: i === 0 ? "start" : i === scale.ticks.length - 1 ? "end" : "middle", fill: colour.muted, style: { fontSize: 6.5, fontFamily: font.sans } },
        t.label,
      ),
    ),
    h("Rect", { x: 250, y: 10, width: 6, height: 6, fill: colour.text }),
    h("SvgText", { x: 260, y: 15.5, fill: colour.muted, style: { fontSize: 6.5, fontFamily: font.sans } }, "supply"),
    h("Path", { d: "M296 10L304 13L296 16Z", fill: colour.text }),
    h("SvgText", { x: 307, y: 15.5, fill: colour.muted, style: { fontSize: 6.5, fontFamily: font.sans } }, "load"),
    h("Line", { x1: 336, x2: 354, y1: 13, y2: 13, stroke: networkInk.noCurrent, strokeWidth: 1, strokeDasharray: "3 2.4" }),
    h("SvgText", { x: 357, y: 15.5, fill: colour.muted, style: { fontSize: 6.5, fontFamily: font.sans } }, `no current (${noCurrent})`),
    h("Line", { x1: 250, x2: 268, y1: 27, y2: 27, stroke: networkInk.overload, strokeOpacity: 0.45, strokeWidth: 5, strokeLinecap: "round" }),
    h("SvgText", { x: 272, y: 29.5, fill: colour.muted, style: { fontSize: 6.5, fontFamily: font.sans } }, `over ampacity (${over})`),
  );

  const hot = results.hottest[0];
  const hotText = hot
    ? results.hottestBasis === "temperature" && hot.temperature_C !== undefined
      ? `; hottest ${hot.id} at ${sig(units === "imperial" ? hot.temperature_C * 1.8 + 32 : hot.temperature_C, 3)} ${units === "imperial" ? "°F" : "°C"}`
      : `; highest density ${hot.id}`
    : "";
  const caption = `Network from the supply (left) to the loads, ${layout.nodes.length} nodes and ${layout.segments.length} segments, coloured by ${scale.title.toLowerCase()}${hotText}. Dashed: no current. Red halo: over ampacity.`;
  const out: PdfNode[] = [figure(caption, diagram, legend)];

  // The worst path: to the load with the lowest voltage.
  const network = inputs as unknown as NetworkInput;
  const worst = loadChoices(network, results)[0];
  if (worst) {
    const series = networkPathSeries(network, results, worst.node, units);
    if (!("error" in series) && series.points.length > 1) {
      out.push(voltageProfileDrawing(series.points.map((p) => ({ distance_m: p.distance_m, voltage_V: p.voltage })), units, series.limitShown ? series.limit : undefined));
      out.push(text({ fontSize: 7.5, color: colour.muted, marginTop: -2, marginBottom: 4 }, `Path to the lowest load voltage: ${networkPathSummary(series)}`));
    }
  }
  return view({}, ...out);
}
