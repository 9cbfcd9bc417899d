"use client";

import { memo, useEffect, useId, useMemo, useRef, useState, type ReactNode, type RefObject } from "react";
import type { NetworkInput, NetworkResults, SegmentResult } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { LegendKey } from "./chart-frame";
import { plain } from "./format-text";
import {
  COLOUR_MODES,
  colourScale,
  diagramFrame,
  layoutNetwork,
  modeAvailable,
  networkInk,
  NETWORK_DRAW_LIMIT,
  NETWORK_LABEL_LIMIT,
  nodeLabels,
  noCurrentMask,
  nodeValue,
  nominalVoltage,
  polylinePath,
  scaleColour,
  scaleGradient,
  segmentValues,
  toFrame,
  topologyFromKey,
  topologyKey,
  topologyOf,
  type ColourMode,
  type ColourScale,
  type DiagramFrame,
  type NetworkLayout,
} from "./network-layout";
import { ink } from "./palette";
import { displayTemperature, temperatureUnit } from "./units";

export interface NetworkDiagramProps {
  input: NetworkInput;
  results: NetworkResults;
  unitSystem: UnitSystem;
  selectedSegmentId?: string;
  onSelectSegment?: (id: string) => void;
}

/** The segment's numbers in words: the hover title, the detail line and the hottest list. */
export function segmentDescription(s: SegmentResult, units: UnitSystem): string {
  const parts = [`${s.id} (${s.from} → ${s.to})`, `${plain(s.current_A, 3)} A`, densityText(s.currentDensity_A_per_mm2, units)];
  if (s.temperatureRise_K !== undefined) parts.push(`rise ${riseText(s.temperatureRise_K, units)}`);
  if (s.temperature_C !== undefined && Number.isFinite(s.temperature_C)) parts.push(`${plain(displayTemperature(s.temperature_C, units), 3)} ${temperatureUnit(units)}`);
  parts.push(`loss ${plain(s.loss_W, 3)} W`);
  if (s.utilisation !== undefined) parts.push(`${plain(s.utilisation * 100, 3)} % of ampacity${s.utilisation > 1 ? ", OVER AMPACITY" : ""}`);
  if (s.direction === 0 || s.current_A === 0) parts.push("no current");
  return parts.join(", ");
}

function densityText(jmm2: number, units: UnitSystem): string {
  return units === "imperial" ? `${plain(jmm2 * 645.16, 3)} A/in²` : `${plain(jmm2, 3)} A/mm²`;
}

function riseText(k: number, units: UnitSystem): string {
  return units === "imperial" ? `${plain(k * 1.8, 3)} °F` : `${plain(k, 3)} K`;
}

/**
 * The layout is a function of the topology only: a key of ids and links is compared on
 * every render (cheap), the layout recomputed only when it changes, so editing a length
 * or a load current recolours the drawing without moving anything.
 */
function useLayout(input: NetworkInput): { layout: NetworkLayout; segmentCount: number } {
  const key = topologyKey(topologyOf(input));
  return useMemo(() => {
    const t = topologyFromKey(key);
    return { layout: t.segments.length > NETWORK_DRAW_LIMIT ? emptyLayout() : layoutNetwork(t), segmentCount: t.segments.length };
  }, [key]);
}

/** The width of an element, followed as it changes (the drawing fills its column). */
function useWidth(ref: RefObject<HTMLElement | null>, initial: number): number {
  const [width, setWidth] = useState(initial);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === "undefined") return;
    const ro = new ResizeObserver((entries) => {
      const w = Math.round(entries[0]?.contentRect.width ?? 0);
      // Whole 8 px steps: a scroll bar appearing does not start a resize loop.
      if (w > 0) setWidth((old) => (Math.abs(old - w) >= 8 ? w : old));
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, [ref]);
  return width;
}

/** Supplies are labelled to their left: the room the drawing adds on that side. */
function supplyRoom(layout: NetworkLayout, labels: boolean): number {
  if (!labels) return 0;
  const widest = Math.max(0, ...layout.nodes.filter((n) => n.role === "supply").map((n) => Math.min(18, n.id.length) * 6.4 + 10));
  return Math.max(0, widest - 28 + 6);
}

function emptyLayout(): NetworkLayout {
  return { nodes: [], segments: [], nodeIndex: new Map(), layers: 0, rows: 0 };
}

/** Bus network coloured by temperature rise, current density or voltage, with supplies, loads and dead branches marked. */
export function NetworkDiagram({ input, results, unitSystem, selectedSegmentId, onSelectSegment }: NetworkDiagramProps) {
  const selectId = useId();
  const findId = useId();
  const { layout, segmentCount } = useLayout(input);
  const nominal = nominalVoltage(input);
  const available = useMemo(() => COLOUR_MODES.filter((m) => modeAvailable(m.mode, results, nominal)), [results, nominal]);
  const [wanted, setWanted] = useState<ColourMode>("rise");
  const mode: ColourMode = available.some((m) => m.mode === wanted) ? wanted : (available[0]?.mode ?? "density");
  const [hovered, setHovered] = useState<string | null>(null);

  const byId = useMemo(() => new Map(results.segments.map((s) => [s.id, s])), [results]);
  const box = useRef<HTMLDivElement>(null);
  const fitWidth = useWidth(box, 640);
  const paint = useMemo(() => colourSegments(mode, results, unitSystem, nominal, layout), [mode, results, unitSystem, nominal, layout]);

  if (segmentCount > NETWORK_DRAW_LIMIT) {
    return (
      <div className="space-y-3" data-testid="network-diagram-too-large">
        <p role="note" className="rounded-md border border-amberline-500/40 bg-amberline-50 px-3 py-2 text-sm text-fen-800">
          This network has {segmentCount.toLocaleString("en")} segments, more than the {NETWORK_DRAW_LIMIT.toLocaleString("en")} the diagram draws; the list of the hottest
          segments below stands in for it. Every segment is still solved and checked.
        </p>
        <HottestSegments results={results} unitSystem={unitSystem} onSelectSegment={onSelectSegment} selectedSegmentId={selectedSegmentId} />
      </div>
    );
  }
  if (layout.nodes.length === 0) return <p className="text-sm text-fen-600">No nodes to draw.</p>;

  const frame = diagramFrame(layout, segmentCount, { fitWidth: fitWidth - 2 - supplyRoom(layout, true) });
  const detailId = hovered ?? selectedSegmentId;
  const detail = detailId !== undefined ? byId.get(detailId) : undefined;
  const scale = paint.scale;
  const summary = diagramSummary(layout, results, paint);

  return (
    <figure className="w-full min-w-0 space-y-2" data-testid="network-diagram-figure" data-colour-mode={mode}>
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor={selectId} className="field-label">
            Colour by
          </label>
          <select id={selectId} className="field-input py-1.5" value={mode} onChange={(e) => setWanted(e.target.value as ColourMode)}>
            {COLOUR_MODES.map((m) => (
              <option key={m.mode} value={m.mode} disabled={!available.some((a) => a.mode === m.mode)}>
                {m.label}
                {m.mode === "rise" && !available.some((a) => a.mode === "rise") ? " (needs an ampacity or a bar arrangement)" : ""}
              </option>
            ))}
          </select>
        </div>
        {onSelectSegment && segmentCount <= NETWORK_LABEL_LIMIT && (
          <div>
            <label htmlFor={findId} className="field-label">
              Segment
            </label>
            <select id={findId} className="field-input py-1.5" value={selectedSegmentId ?? ""} onChange={(e) => e.target.value && onSelectSegment(e.target.value)}>
              <option value="">Choose a segment…</option>
              {layout.segments.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.id}
                </option>
              ))}
            </select>
          </div>
        )}
      </div>
      <div ref={box} className="max-h-[72vh] w-full overflow-auto rounded-md border border-fen-200 bg-white">
        <DiagramSvg
          layout={layout}
          frame={frame}
          paint={paint}
          summary={summary}
          selectedSegmentId={selectedSegmentId}
          onSelectSegment={onSelectSegment}
          onHover={setHovered}
        />
      </div>
      <p className="min-h-5 text-xs text-fen-700" aria-live="polite" data-testid="network-segment-detail">
        {detail ? segmentDescription(detail, unitSystem) : "Point at a segment to read its current, density, rise and loss; click it to select it."}
      </p>
      <ScaleLegend scale={scale} />
      <div className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-fen-600">
        <LegendKey colour={ink.text} label="Supply" />
        <span className="inline-flex items-center gap-1.5">
          <svg aria-hidden="true" width="12" height="10" viewBox="0 0 12 10">
            <path d="M2 0L12 5L2 10Z" fill={ink.text} />
          </svg>
          Load
        </span>
        <LegendKey colour={networkInk.noCurrent} label={`No current (${paint.noCurrent} segment${paint.noCurrent === 1 ? "" : "s"})`} shape="dash" />
        <span className="inline-flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-2.5 w-4 rounded-sm" style={{ background: networkInk.overload, opacity: 0.45 }} />
          Over ampacity ({paint.over})
        </span>
        {paint.noValue > 0 && <LegendKey colour={networkInk.noValue} label={`No ${scale.title.toLowerCase()} known (${paint.noValue})`} />}
      </div>
      <figcaption className="text-xs text-fen-600">{summary}</figcaption>
    </figure>
  );
}

interface Paint {
  scale: ColourScale;
  /** Per layout segment: stroke colour, dashed (no current), over ampacity. */
  stroke: string[];
  dead: Uint8Array;
  overload: Uint8Array;
  /** Node fill in the voltage modes (undefined otherwise). */
  nodeFill?: string[];
  /** Per layout segment: the hover title. */
  titles: string[];
  noCurrent: number;
  over: number;
  noValue: number;
  hottest?: { id: string; value: number };
}

function colourSegments(mode: ColourMode, results: NetworkResults, units: UnitSystem, nominal: number, layout: NetworkLayout): Paint {
  const values = segmentValues(mode, results, units, nominal);
  const voltageMode = mode === "voltage" || mode === "voltage-pct";
  const nodeVals = voltageMode ? results.nodes.map((n) => nodeValue(mode, n.voltage_V, nominal)) : [];
  const scale = colourScale(mode, values, units, nodeVals);
  const dead = noCurrentMask(results);
  const index = new Map(results.segments.map((s, k) => [s.id, k]));
  const n = layout.segments.length;
  const stroke: string[] = new Array(n);
  const titles: string[] = new Array(n);
  const deadOut = new Uint8Array(n);
  const overload = new Uint8Array(n);
  let noCurrent = 0;
  let over = 0;
  let noValue = 0;
  let hottest: Paint["hottest"];
  for (let i = 0; i < n; i++) {
    const k = index.get(layout.segments[i]!.id);
    const s = k === undefined ? undefined : results.segments[k];
    if (k === undefined || !s) {
      stroke[i] = networkInk.noValue;
      titles[i] = `${layout.segments[i]!.id}: not solved yet`;
      noValue++;
      continue;
    }
    const v = values[k]!;
    deadOut[i] = dead[k]!;
    if (dead[k]) noCurrent++;
    if (s.utilisation !== undefined && s.utilisation > 1) {
      overload[i] = 1;
      over++;
    }
    if (!Number.isFinite(v)) noValue++;
    else if (!voltageMode && (!hottest || v > hottest.value)) hottest = { id: s.id, value: v };
    else if (voltageMode && (!hottest || v < hottest.value)) hottest = { id: s.id, value: v };
    stroke[i] = dead[k] ? networkInk.noCurrent : scaleColour(scale, v);
    titles[i] = segmentDescription(s, units);
  }
  let nodeFill: string[] | undefined;
  if (voltageMode) {
    const byId = new Map(results.nodes.map((nd, j) => [nd.id, nodeVals[j]!]));
    nodeFill = layout.nodes.map((nd) => scaleColour(scale, byId.get(nd.id) ?? Number.NaN));
  }
  return { scale, stroke, dead: deadOut, overload, nodeFill, titles, noCurrent, over, noValue, hottest };
}

function diagramSummary(layout: NetworkLayout, results: NetworkResults, paint: Paint): string {
  const supplies = layout.nodes.filter((n) => n.role === "supply").map((n) => n.id);
  const loads = layout.nodes.filter((n) => n.role === "load").length;
  const s = paint.scale;
  const parts = [
    `Bus network diagram: ${layout.nodes.length} nodes and ${layout.segments.length} segments fed from ${supplies.length ? supplies.slice(0, 3).join(", ") + (supplies.length > 3 ? ` and ${supplies.length - 3} more` : "") : "no supply"}, ${loads} load${loads === 1 ? "" : "s"}`,
    `coloured by ${s.title.toLowerCase()} on a scale from ${plain(s.domain[0], 5)} to ${plain(s.domain[1], 5)} ${s.unit}`,
  ];
  if (paint.hottest) {
    const word = s.reversed ? "lowest" : "highest";
    parts.push(`${word} ${paint.hottest.id} at ${plain(paint.hottest.value, 4)} ${s.unit}`);
  }
  if (results.maxDrop) parts.push(`largest drop ${plain(results.maxDrop.drop_V, 3)} V (${plain(results.maxDrop.drop_pct, 3)} %) at ${results.maxDrop.node}`);
  parts.push(paint.noCurrent ? `${paint.noCurrent} segment${paint.noCurrent === 1 ? " carries" : "s carry"} no current (dashed)` : "every segment carries current");
  parts.push(paint.over ? `${paint.over} segment${paint.over === 1 ? "" : "s"} over ampacity (red halo)` : "no segment over ampacity");
  return `${parts.join("; ")}.`;
}

/** The gradient with its ticks in physical units. */
function ScaleLegend({ scale }: { scale: ColourScale }) {
  const steps = scaleGradient(scale, 24);
  const gradient = `linear-gradient(to right, ${steps.map((c, k) => `${c} ${((k + 0.5) / steps.length) * 100}%`).join(", ")})`;
  return (
    <div className="w-full max-w-md" data-testid="network-legend">
      <div className="mb-1 text-xs font-medium text-fen-800">
        {scale.title} ({scale.unit}){scale.reversed ? ": darker is lower" : ": darker is higher"}
      </div>
      <div aria-hidden="true" className="h-3 w-full rounded-sm border border-fen-200" style={{ background: gradient }} />
      <div className="relative h-4 w-full text-[11px] tabular-nums text-fen-700">
        {scale.ticks.map((t, i) => (
          <span
            key={t.value}
            data-legend-tick={t.label}
            className="absolute top-0.5 whitespace-nowrap"
            style={{ left: `${t.at * 100}%`, transform: i === 0 ? "none" : i === scale.ticks.length - 1 ? "translateX(-100%)" : "translateX(-50%)" }}
          >
            {t.label}
          </span>
        ))}
      </div>
    </div>
  );
}

interface SvgProps {
  layout: NetworkLayout;
  frame: DiagramFrame;
  paint: Paint;
  summary: string;
  selectedSegmentId?: string;
  onSelectSegment?: (id: string) => void;
  onHover: (id: string | null) => void;
}

/** The drawing itself; memoised so a hover (which only changes the detail line) does not redraw thousands of paths. */
const DiagramSvg = memo(function DiagramSvg({ layout, frame: f, paint, summary, selectedSegmentId, onSelectSegment, onHover }: SvgProps) {
  const dense = layout.segments.length > 400;
  const width = Math.max(1.2, Math.min(4, f.rowGap * 0.28, f.colGap * 0.08));
  const hitWidth = Math.max(8, width + 6);
  const over: ReactNode[] = [];
  const drawn: ReactNode[] = [];
  let selected: ReactNode = null;
  layout.segments.forEach((s, i) => {
    if (s.points.length < 2) return;
    const d = polylinePath(f, s.points);
    if (paint.overload[i]) over.push(<path key={`o${i}`} d={d} stroke={networkInk.overload} strokeOpacity={0.45} strokeWidth={width + 7} fill="none" strokeLinecap="round" strokeLinejoin="round" />);
    if (s.id === selectedSegmentId) selected = <path d={d} stroke={networkInk.selected} strokeOpacity={0.28} strokeWidth={width + 10} fill="none" strokeLinecap="round" strokeLinejoin="round" />;
    const deadSeg = paint.dead[i] === 1;
    drawn.push(
      <g
        key={s.id}
        data-segment={s.id}
        data-dead={deadSeg ? "" : undefined}
        data-over={paint.overload[i] ? "" : undefined}
        onClick={onSelectSegment ? () => onSelectSegment(s.id) : undefined}
        onMouseEnter={() => onHover(s.id)}
        onMouseLeave={() => onHover(null)}
        style={onSelectSegment ? { cursor: "pointer" } : undefined}
      >
        <title>{paint.titles[i]}</title>
        <path
          d={d}
          stroke={paint.stroke[i]}
          strokeWidth={deadSeg ? Math.max(1.2, width * 0.6) : s.id === selectedSegmentId ? width + 1.5 : width}
          strokeDasharray={deadSeg ? "5 4" : undefined}
          fill="none"
          strokeLinecap={deadSeg ? "butt" : "round"}
          strokeLinejoin="round"
        />
        {!dense && <path d={d} stroke="transparent" strokeWidth={hitWidth} fill="none" />}
      </g>,
    );
  });

  const r = Math.max(1.5, Math.min(4, f.rowGap * 0.2));
  const nodes: ReactNode[] = [];
  const labels: ReactNode[] = [];
  layout.nodes.forEach((n, i) => {
    const [x, y] = toFrame(f, [n.x, n.y]);
    const fill = paint.nodeFill?.[i];
    const s = Math.max(5, r * 2.8);
    const L = Math.max(6, r * 2.6);
    const a = r + 2;
    nodes.push(
      <g key={`n${i}`} data-node={n.id} data-role={n.role}>
        <title>{`${n.id}${n.role === "supply" ? " (supply)" : n.role === "load" ? " (load)" : ""}${n.reached ? "" : ": no path to a supply"}`}</title>
        {n.role === "supply" ? (
          <rect x={x - s / 2} y={y - s / 2} width={s} height={s} fill={ink.text} rx={1.5} />
        ) : (
          <circle cx={x} cy={y} r={r} fill={fill ?? ink.paper} stroke={n.reached ? ink.series : networkInk.noCurrent} strokeWidth={1.3} />
        )}
        {n.role === "load" && <path d={`M${x + a} ${y - L * 0.45}L${x + a + L} ${y}L${x + a} ${y + L * 0.45}Z`} fill={ink.text} stroke={ink.paper} strokeWidth={1} paintOrder="stroke" />}
      </g>,
    );
  });
  const placed = nodeLabels(layout, f, { fontSize: 11, nodeRadius: r, loadMarker: Math.max(6, r * 2.6) });
  placed.forEach((p, i) => {
    if (!p) return;
    labels.push(
      <text
        key={`t${i}`}
        x={p.x}
        y={p.y}
        textAnchor={p.anchor}
        fontSize={11}
        fill={ink.text}
        stroke={ink.paper}
        strokeWidth={3}
        paintOrder="stroke"
        style={{ pointerEvents: "none" }}
      >
        {p.text}
      </text>,
    );
  });
  const vbX = -supplyRoom(layout, f.labels);
  return (
    <svg
      role="img"
      aria-label={summary}
      data-testid="network-diagram"
      width={f.width - vbX}
      height={f.height}
      viewBox={`${vbX} 0 ${f.width - vbX} ${f.height}`}
      className="block"
      onMouseLeave={() => onHover(null)}
    >
      <g>{over}</g>
      {selected}
      <g>{drawn}</g>
      <g>{nodes}</g>
      <g>{labels}</g>
    </svg>
  );
});

/** The ten hottest segments (by temperature, or by current density when no temperature is known), each selectable. */
export function HottestSegments({ results, unitSystem, selectedSegmentId, onSelectSegment }: { results: NetworkResults; unitSystem: UnitSystem; selectedSegmentId?: string; onSelectSegment?: (id: string) => void }) {
  const byId = new Map(results.segments.map((s) => [s.id, s]));
  if (results.hottest.length === 0) return null;
  const tu = temperatureUnit(unitSystem);
  return (
    <table className="data-table" data-testid="network-hottest">
      <caption className="mb-1 text-left text-xs font-medium text-fen-700">
        Hottest segments ({results.hottestBasis === "temperature" ? "by temperature" : "by current density: no temperature is known"})
      </caption>
      <thead>
        <tr>
          <th>Segment</th>
          <th className="text-right">Current</th>
          <th className="text-right">Density</th>
          <th className="text-right">Temperature</th>
          <th className="text-right">Of ampacity</th>
        </tr>
      </thead>
      <tbody>
        {results.hottest.map((h) => {
          const s = byId.get(h.id);
          const overloaded = s?.utilisation !== undefined && s.utilisation > 1;
          return (
            <tr key={h.id} className={h.id === selectedSegmentId ? "bg-copper-50" : overloaded ? "bg-signal-50" : undefined}>
              <td>
                {onSelectSegment ? (
                  <button type="button" className="text-left font-medium text-copper-700 underline-offset-2 hover:underline" onClick={() => onSelectSegment(h.id)}>
                    {h.id}
                  </button>
                ) : (
                  h.id
                )}
              </td>
              <td className="text-right tabular-nums">{s ? `${plain(s.current_A, 4)} A` : "—"}</td>
              <td className="text-right tabular-nums">{densityText(h.currentDensity_A_per_mm2, unitSystem)}</td>
              <td className="text-right tabular-nums">{h.temperature_C !== undefined ? `${plain(displayTemperature(h.temperature_C, unitSystem), 4)} ${tu}` : "—"}</td>
              <td className="text-right tabular-nums">{s?.utilisation !== undefined ? `${plain(s.utilisation * 100, 3)} %${overloaded ? " (over)" : ""}` : "—"}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
