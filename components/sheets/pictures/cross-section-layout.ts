import { barCentres, type BarArrangement } from "@/lib/engine/geometry";
import type { FilamentDensity } from "@/lib/engine/filament";
import { sig } from "@/lib/engine/format";
import { upTo } from "./format-text";
import { densityColour, densityPosition } from "./density-colours";
import type { PictureUnits } from "./units";

/**
 * Layout of the scaled busbar cross-section: everything in millimetres of the real
 * arrangement (the SVG user unit is 1 mm), annotations sized by a drawing unit `u` that
 * grows with the arrangement, so the whole figure scales with it and reads at the same
 * size on screen whatever the bars measure.
 *
 * Frames: the arrangement frame (a across the thickness, along the row of phase packs;
 * b along the bar width, geometry.ts) maps to the drawing as (x, y) = (a, b) for bars
 * on edge and (x, y) = (b, a) for bars lying flat — the frame the filament densities
 * already use. SVG y points down, so phase L1 is on the left (edge) or at the top (flat).
 */

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface DrawnBar extends Box {
  phase: number;
  bar: number;
}

export interface DrawnCell extends Box {
  fill: string;
  value: number;
}

export interface Segment {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
}

export interface TextMark {
  x: number;
  y: number;
  text: string;
  /** 0 horizontal, −90 reading upwards (vertical dimension). */
  rotate: 0 | -90;
  size: number;
  anchor?: "start" | "middle" | "end";
}

export interface DimensionMark {
  kind: "width" | "thickness" | "gap" | "spacing";
  /** The dimension line between the two arrow tips. */
  line: Segment;
  extensions: Segment[];
  /** Arrowheads as closed polygons ("x,y x,y x,y"). */
  arrows: string[];
  /** Extra line beyond the tips when the arrows sit outside a short span. */
  tails: Segment[];
  label: TextMark;
  value_m: number;
}

export interface ScaleBarMark {
  x: number;
  y: number;
  /** Drawn length, mm (the user unit). */
  length: number;
  height: number;
  /** Alternating segments, dark first. */
  segments: Box[];
  labels: TextMark[];
}

export interface LegendMark {
  x: number;
  y: number;
  w: number;
  h: number;
  steps: { x: number; w: number; fill: string }[];
  min: number;
  max: number;
  minText: string;
  maxText: string;
  /** Tick at |J|/J_dc = 1 when it falls inside the range. */
  unityX?: number;
  titleX: number;
  titleY: number;
  size: number;
  ticks: TextMark[];
}

export interface CrossSectionLayout {
  viewBox: Box;
  u: number;
  fontSize: number;
  bars: DrawnBar[];
  cells: DrawnCell[];
  centreLines: Segment[];
  dimensions: DimensionMark[];
  phaseLabels: TextMark[];
  scaleBar: ScaleBarMark;
  legend?: LegendMark;
  /** Bounding box of the bars alone. */
  extent: Box;
}

const MM = 1000;

/** Default labels: L1 for one pack, L1 and N for go and return, L1–L3 for three phases. */
export function defaultPhaseLabels(phases: number): string[] {
  if (phases === 2) return ["L1", "N"];
  return Array.from({ length: phases }, (_, k) => `L${k + 1}`);
}

/** A length for a dimension label: "100 mm", "12.5 mm"; imperial "3.937 in". */
export function lengthLabel(value_m: number, units: PictureUnits): string {
  if (units === "imperial") return `${upTo(value_m / 0.0254, 3)} in`;
  return `${upTo(value_m * MM, 1)} mm`;
}


/** Largest 1·10ⁿ, 2·10ⁿ or 5·10ⁿ not above `limit` (> 0). */
export function niceBelow(limit: number): number {
  const p = Math.pow(10, Math.floor(Math.log10(limit)));
  for (const m of [5, 2, 1]) if (m * p <= limit * (1 + 1e-12)) return m * p;
  return p;
}

/** Rough advance width of a label in the sans face used on the sheets. */
function textWidth(text: string, size: number): number {
  return text.length * size * 0.58;
}

export function crossSectionLayout(
  arr: BarArrangement,
  opts: { density?: readonly FilamentDensity[]; units?: PictureUnits; phaseLabels?: readonly string[] } = {},
): CrossSectionLayout {
  const units = opts.units ?? "metric";
  const flat = arr.orientation === "flat";
  const t = arr.barThickness_m * MM;
  const W = arr.barWidth_m * MM;
  const centres = barCentres(arr).map((c) => ({ ...c, a: c.x * MM }));
  const toXY = (a: number, b: number): [number, number] => (flat ? [b, a] : [a, b]);

  const bars: DrawnBar[] = centres.map((c) => {
    const [x, y] = toXY(c.a - t / 2, -W / 2);
    return flat ? { phase: c.phase, bar: c.bar, x, y, w: W, h: t } : { phase: c.phase, bar: c.bar, x, y, w: t, h: W };
  });

  const aMin = Math.min(...centres.map((c) => c.a)) - t / 2;
  const aMax = Math.max(...centres.map((c) => c.a)) + t / 2;
  const bMin = -W / 2;
  const bMax = W / 2;
  const [ex0, ey0] = toXY(aMin, bMin);
  const [ex1, ey1] = toXY(aMax, bMax);
  const extent: Box = { x: ex0, y: ey0, w: ex1 - ex0, h: ey1 - ey0 };

  // Drawing unit: text ≈ 13 px with the figure at ~700 px wide or ~500 px high (the SVG's max height).
  const u = Math.max(extent.w / 80, extent.h / 45);
  const fs = 1.9 * u;
  const arrowL = 0.9 * u;
  const arrowW = 0.32 * u;
  const extGap = 0.4 * u;
  const extOver = 0.4 * u;

  // --- dimensions, built in (a, b) and mapped -----------------------------------
  const dimensions: DimensionMark[] = [];
  const seg = (a1: number, b1: number, a2: number, b2: number): Segment => {
    const [x1, y1] = toXY(a1, b1);
    const [x2, y2] = toXY(a2, b2);
    return { x1, y1, x2, y2 };
  };
  /** Dimension along a (from a1 to a2) on the line b = bLine; `out` = ±1, the side away from the bars; features end at bFeature. */
  const dimA = (kind: DimensionMark["kind"], a1: number, a2: number, bFeature: number, bLine: number, out: 1 | -1, value_m: number) =>
    dimensions.push(dimension(kind, "a", a1, a2, bFeature, bFeature, bLine, out, value_m));
  const dimB = (kind: DimensionMark["kind"], b1: number, b2: number, aFeature: number, aLine: number, out: 1 | -1, value_m: number) =>
    dimensions.push(dimension(kind, "b", b1, b2, aFeature, aFeature, aLine, out, value_m));

  function dimension(
    kind: DimensionMark["kind"],
    along: "a" | "b",
    p1: number,
    p2: number,
    f1: number,
    f2: number,
    line: number,
    out: 1 | -1,
    value_m: number,
  ): DimensionMark {
    // pt(p, q): p along the measured axis, q across it.
    const pt = (p: number, q: number): [number, number] => (along === "a" ? toXY(p, q) : toXY(q, p));
    const sg = (pa: number, qa: number, pb: number, qb: number): Segment => {
      const [x1, y1] = pt(pa, qa);
      const [x2, y2] = pt(pb, qb);
      return { x1, y1, x2, y2 };
    };
    const [lx1, ly1] = pt(p1, line);
    const [lx2, ly2] = pt(p2, line);
    const extensions = [sg(p1, f1 + out * extGap, p1, line + out * extOver), sg(p2, f2 + out * extGap, p2, line + out * extOver)];
    const inside = p2 - p1 >= 3 * arrowL;
    const head = (tip: number, dir: 1 | -1) => {
      // dir: direction from the tip back along the shaft.
      const pts = [pt(tip, line), pt(tip + dir * arrowL, line + arrowW), pt(tip + dir * arrowL, line - arrowW)];
      return pts.map(([x, y]) => `${round(x)},${round(y)}`).join(" ");
    };
    const arrows = inside ? [head(p1, 1), head(p2, -1)] : [head(p1, -1), head(p2, 1)];
    const tails = inside ? [] : [sg(p1 - 2.2 * arrowL, line, p1, line), sg(p2, line, p2 + 2.2 * arrowL, line)];
    const [cx, cy] = pt((p1 + p2) / 2, line + out * (0.45 * u + fs / 2));
    const vertical = Math.abs(lx1 - lx2) < Math.abs(ly1 - ly2);
    return {
      kind,
      line: { x1: lx1, y1: ly1, x2: lx2, y2: ly2 },
      extensions,
      arrows,
      tails,
      label: { x: cx, y: cy, text: lengthLabel(value_m, units), rotate: vertical ? -90 : 0, size: fs },
      value_m,
    };
  }

  const first = centres[0]!;
  // Thickness of L1's first bar, on the near side (above on edge, left when flat).
  dimA("thickness", first.a - t / 2, first.a + t / 2, bMin, bMin - 2 * u, -1, arr.barThickness_m);
  // Bar width, beside the first bar (left on edge, above when flat).
  dimB("width", bMin, bMax, aMin, aMin - 3 * u, -1, arr.barWidth_m);
  // Gap between L1's first two bars, on the far side.
  if (arr.barsPerPhase > 1) {
    const second = centres[1]!;
    dimA("gap", first.a + t / 2, second.a - t / 2, bMax, bMax + 2 * u, 1, arr.gap_m);
  }
  // Phase spacing, centre to centre, with centre lines through the packs.
  const centreLines: Segment[] = [];
  const packCentre = (p: number) => p * arr.phaseSpacing_m * MM;
  const spacingLine = bMax + (arr.barsPerPhase > 1 ? 6 : 2.5) * u;
  if (arr.phases > 1) {
    for (let p = 0; p < arr.phases; p++) centreLines.push(seg(packCentre(p), bMin - 1.2 * u, packCentre(p), spacingLine + extOver));
    for (let p = 0; p + 1 < arr.phases; p++) {
      const d = dimension("spacing", "a", packCentre(p), packCentre(p + 1), bMax + 1.2 * u - extGap, bMax + 1.2 * u - extGap, spacingLine, 1, arr.phaseSpacing_m);
      d.extensions = []; // the centre lines stand in for them
      dimensions.push(d);
    }
  }

  // --- phase labels, beyond the thickness dimension -------------------------------
  const labels = opts.phaseLabels ?? defaultPhaseLabels(arr.phases);
  const phaseLabels: TextMark[] = [];
  for (let p = 0; p < arr.phases; p++) {
    const text = labels[p] ?? `P${p + 1}`;
    const off = 6.4 * u + (flat ? textWidth(text, 2.2 * u) / 2 : 0);
    const [x, y] = toXY(packCentre(p), bMin - off);
    phaseLabels.push({ x, y, text, rotate: 0, size: 2.2 * u });
  }

  // --- filament cells --------------------------------------------------------------
  const density = opts.density ?? [];
  let cells: DrawnCell[] = [];
  let legend: LegendMark | undefined;
  let dMin = Infinity;
  let dMax = -Infinity;
  for (const d of density) {
    if (!Number.isFinite(d.jMagnitudeRelative)) continue;
    dMin = Math.min(dMin, d.jMagnitudeRelative);
    dMax = Math.max(dMax, d.jMagnitudeRelative);
  }
  const hasDensity = density.length > 0 && dMin <= dMax;
  if (hasDensity) {
    cells = density.map((d) => ({
      x: (d.x - d.w / 2) * MM,
      y: (d.y - d.h / 2) * MM,
      w: d.w * MM,
      h: d.h * MM,
      value: d.jMagnitudeRelative,
      fill: densityColour(densityPosition(d.jMagnitudeRelative, dMin, dMax)),
    }));
  }

  // --- bounding box of the drawing and its annotations ------------------------------
  const bb = { x0: extent.x, y0: extent.y, x1: extent.x + extent.w, y1: extent.y + extent.h };
  const grow = (x: number, y: number) => {
    bb.x0 = Math.min(bb.x0, x);
    bb.x1 = Math.max(bb.x1, x);
    bb.y0 = Math.min(bb.y0, y);
    bb.y1 = Math.max(bb.y1, y);
  };
  const growText = (m: TextMark) => {
    const half = textWidth(m.text, m.size) / 2;
    const hx = m.rotate === 0 ? half : m.size / 2;
    const hy = m.rotate === 0 ? m.size / 2 : half;
    grow(m.x - hx, m.y - hy);
    grow(m.x + hx, m.y + hy);
  };
  for (const d of dimensions) {
    for (const s of [d.line, ...d.extensions, ...d.tails]) {
      grow(s.x1, s.y1);
      grow(s.x2, s.y2);
    }
    growText(d.label);
  }
  for (const s of centreLines) {
    grow(s.x1, s.y1);
    grow(s.x2, s.y2);
  }
  phaseLabels.forEach(growText);

  // --- footer: scale bar (left) and density legend (right) --------------------------
  const footerTop = bb.y1 + 2.5 * u;
  const unitLen = units === "imperial" ? 25.4 : 1;
  const sbLen = niceBelow((0.4 * Math.max(extent.w, extent.h)) / unitLen) * unitLen;
  const sbH = 0.7 * u;
  const sbSegments = 4;
  const labelSize = 1.6 * u;
  const legendW = 24 * u;
  const footerW = sbLen + 6 * u + (hasDensity ? legendW : 0);
  const drawW = bb.x1 - bb.x0;
  const vbW = Math.max(drawW, footerW) + 2 * u;
  const vbX = (bb.x0 + bb.x1) / 2 - vbW / 2;
  const left = vbX + u;
  const right = vbX + vbW - u;

  const sbY = footerTop + labelSize + 0.6 * u;
  const scaleBar: ScaleBarMark = {
    x: left,
    y: sbY,
    length: sbLen,
    height: sbH,
    segments: Array.from({ length: sbSegments }, (_, k) => ({ x: left + (k * sbLen) / sbSegments, y: sbY, w: sbLen / sbSegments, h: sbH })),
    labels: [
      { x: left, y: sbY - 0.5 * u - labelSize / 2, text: "0", rotate: 0, size: labelSize },
      { x: left + sbLen, y: sbY - 0.5 * u - labelSize / 2, text: lengthLabel(sbLen / MM, units), rotate: 0, size: labelSize },
    ],
  };
  let footerBottom = sbY + sbH;

  if (hasDensity) {
    const steps = 40;
    const lx = right - legendW;
    const ly = sbY;
    const lh = 1.1 * u;
    const span = dMax - dMin;
    const minText = sig(dMin, 3);
    const maxText = sig(dMax, 3);
    const ticks: TextMark[] = [
      { x: lx, y: ly + lh + 0.4 * u + labelSize / 2, text: minText, rotate: 0, size: labelSize, anchor: "start" },
      { x: lx + legendW, y: ly + lh + 0.4 * u + labelSize / 2, text: maxText, rotate: 0, size: labelSize, anchor: "end" },
    ];
    const unity = span > 0 && dMin < 1 && dMax > 1 ? lx + ((1 - dMin) / span) * legendW : undefined;
    // Show the unity tick only where it does not crowd the end labels.
    const unityX = unity !== undefined && unity - lx > 4.2 * labelSize && lx + legendW - unity > 4.2 * labelSize ? unity : undefined;
    if (unityX !== undefined) ticks.push({ x: unityX, y: ly + lh + 0.4 * u + labelSize / 2, text: "1", rotate: 0, size: labelSize });
    legend = {
      x: lx,
      y: ly,
      w: legendW,
      h: lh,
      steps: Array.from({ length: steps }, (_, k) => ({
        x: lx + (k * legendW) / steps,
        w: legendW / steps,
        fill: densityColour(span > 0 ? (k + 0.5) / steps : 0.5),
      })),
      min: dMin,
      max: dMax,
      minText,
      maxText,
      unityX,
      titleX: lx,
      titleY: footerTop + labelSize / 2,
      size: labelSize,
      ticks,
    };
    footerBottom = Math.max(footerBottom, ly + lh + 0.4 * u + labelSize);
  }
  if (hasDensity) footerBottom += 0.2 * u;

  const vbY = bb.y0 - u;
  const viewBox: Box = { x: vbX, y: vbY, w: vbW, h: footerBottom + u - vbY };
  return { viewBox, u, fontSize: fs, bars, cells, centreLines, dimensions, phaseLabels, scaleBar, legend, extent };
}

function round(v: number): number {
  return Math.round(v * 1000) / 1000;
}
