import type { BarArrangement } from "@/lib/engine/geometry";
import type { FilamentDensity } from "@/lib/engine/filament";
import { crossSectionLayout, defaultPhaseLabels, lengthLabel, type Segment, type TextMark } from "./cross-section-layout";
import { plain } from "./format-text";
import { ink } from "./palette";
import type { PictureUnits } from "./units";

export interface BarCrossSectionProps {
  arrangement: BarArrangement;
  /** Filament current densities from `barArrangementAc`; without them the bars are drawn plain (DC view). */
  density?: readonly FilamentDensity[];
  /** Frequency the densities were solved at, for the legend and the summary. */
  frequency_Hz?: number;
  units?: PictureUnits;
  phaseLabels?: readonly string[];
  className?: string;
}

const PHASES_WORD = { 1: "single-pack", 2: "two-pack (go and return)", 3: "three-phase" } as const;

/** One sentence describing the drawing, for screen readers and the SVG title. */
export function crossSectionSummary(p: Pick<BarCrossSectionProps, "arrangement" | "density" | "frequency_Hz" | "units" | "phaseLabels">): string {
  const a = p.arrangement;
  const units = p.units ?? "metric";
  const len = (m: number) => lengthLabel(m, units);
  const labels = (p.phaseLabels ?? defaultPhaseLabels(a.phases)).slice(0, a.phases).join(", ");
  const parts = [
    `Scaled cross-section of a ${PHASES_WORD[a.phases]} busbar arrangement (${labels})`,
    `${a.barsPerPhase} bar${a.barsPerPhase > 1 ? "s" : ""} per phase of ${len(a.barWidth_m)} × ${len(a.barThickness_m)}, ${a.orientation === "edge" ? "on edge" : "lying flat"}`,
  ];
  if (a.barsPerPhase > 1) parts.push(`gap ${len(a.gap_m)}`);
  if (a.phases > 1) parts.push(`phase spacing ${len(a.phaseSpacing_m)} centre to centre`);
  const vals = (p.density ?? []).map((d) => d.jMagnitudeRelative).filter(Number.isFinite);
  if (vals.length > 0) {
    const at = p.frequency_Hz !== undefined ? ` at ${plain(p.frequency_Hz, 3)} Hz` : "";
    parts.push(`coloured by AC current density${at}, |J| relative to the DC density from ${plain(Math.min(...vals), 3)} to ${plain(Math.max(...vals), 3)}`);
  } else {
    parts.push("DC view, uniform current density");
  }
  return `${parts.join("; ")}.`;
}

/**
 * Cross-section of a busbar arrangement drawn to scale (1 SVG unit = 1 mm), with
 * dimension lines, phase labels, a scale bar and, when filament densities are given,
 * the AC current density as a colour map. Pure SVG; renders on the server.
 */
export function BarCrossSection({ arrangement, density, frequency_Hz, units = "metric", phaseLabels, className }: BarCrossSectionProps) {
  const L = crossSectionLayout(arrangement, { density, units, phaseLabels });
  const summary = crossSectionSummary({ arrangement, density, frequency_Hz, units, phaseLabels });
  const vb = L.viewBox;
  const thin = 0.12 * L.u;
  const hair = 0.08 * L.u;
  const showCells = L.cells.length > 0;
  // Seam cover: each filament cell is stroked in its own colour so anti-aliasing leaves no hairlines between cells.
  const seam = Math.min(...L.cells.map((c) => Math.min(c.w, c.h)), L.u) * 0.15;

  return (
    <svg
      role="img"
      aria-label={summary}
      viewBox={`${r(vb.x)} ${r(vb.y)} ${r(vb.w)} ${r(vb.h)}`}
      preserveAspectRatio="xMidYMid meet"
      className={className}
      style={{ display: "block", width: "100%", height: "auto", maxHeight: "32rem" }}
      data-picture="bar-cross-section"
    >
      <title>{summary}</title>
      <rect x={r(vb.x)} y={r(vb.y)} width={r(vb.w)} height={r(vb.h)} fill={ink.paper} />

      <g data-layer="bars">
        {showCells &&
          L.cells.map((c, i) => (
            <rect key={i} x={r(c.x)} y={r(c.y)} width={r(c.w)} height={r(c.h)} fill={c.fill} stroke={c.fill} strokeWidth={r(seam)} />
          ))}
        {L.bars.map((b) => (
          <rect
            key={`${b.phase}-${b.bar}`}
            data-bar={`${b.phase}-${b.bar}`}
            x={r(b.x)}
            y={r(b.y)}
            width={r(b.w)}
            height={r(b.h)}
            fill={showCells ? "none" : ink.metal}
            stroke={showCells ? ink.text : ink.metalEdge}
            strokeWidth={r(thin)}
          />
        ))}
      </g>

      <g data-layer="centre-lines" stroke={ink.faint} strokeWidth={r(hair)} strokeDasharray={`${r(1.6 * L.u)} ${r(0.4 * L.u)} ${r(0.3 * L.u)} ${r(0.4 * L.u)}`}>
        {L.centreLines.map((s, i) => (
          <Line key={i} s={s} />
        ))}
      </g>

      <g data-layer="dimensions" stroke={ink.muted} strokeWidth={r(hair)} fill={ink.muted}>
        {L.dimensions.map((d, i) => (
          <g key={i} data-dimension={d.kind}>
            {d.extensions.map((s, j) => (
              <Line key={`e${j}`} s={s} />
            ))}
            <Line s={d.line} />
            {d.tails.map((s, j) => (
              <Line key={`t${j}`} s={s} />
            ))}
            {d.arrows.map((a, j) => (
              <polygon key={`a${j}`} points={a} stroke="none" />
            ))}
            <Text m={d.label} fill={ink.text} />
          </g>
        ))}
      </g>

      <g data-layer="phase-labels">
        {L.phaseLabels.map((m, i) => (
          <Text key={i} m={m} fill={ink.text} weight={600} />
        ))}
      </g>

      <g data-layer="scale-bar">
        {L.scaleBar.segments.map((s, i) => (
          <rect key={i} x={r(s.x)} y={r(s.y)} width={r(s.w)} height={r(s.h)} fill={i % 2 === 0 ? ink.text : ink.paper} stroke={ink.text} strokeWidth={r(hair)} />
        ))}
        {L.scaleBar.labels.map((m, i) => (
          <Text key={i} m={m} fill={ink.muted} />
        ))}
      </g>

      {L.legend && (
        <g data-layer="legend">
          <text x={r(L.legend.titleX)} y={r(L.legend.titleY)} fontSize={r(L.legend.size)} fill={ink.muted} dominantBaseline="central">
            |J| / J<tspan fontSize={r(L.legend.size * 0.72)} dy={r(0.35 * L.legend.size)}>dc</tspan>
            <tspan dy={r(-0.35 * L.legend.size)}>{frequency_Hz !== undefined ? `  at ${plain(frequency_Hz, 3)} Hz` : ""}</tspan>
          </text>
          {L.legend.steps.map((s, i) => (
            <rect key={i} x={r(s.x)} y={r(L.legend!.y)} width={r(s.w + 0.02 * L.u)} height={r(L.legend!.h)} fill={s.fill} />
          ))}
          <rect x={r(L.legend.x)} y={r(L.legend.y)} width={r(L.legend.w)} height={r(L.legend.h)} fill="none" stroke={ink.text} strokeWidth={r(hair)} />
          {L.legend.unityX !== undefined && (
            <line x1={r(L.legend.unityX)} x2={r(L.legend.unityX)} y1={r(L.legend.y)} y2={r(L.legend.y + L.legend.h + 0.3 * L.u)} stroke={ink.text} strokeWidth={r(hair)} />
          )}
          {L.legend.ticks.map((m, i) => (
            <Text key={i} m={m} fill={ink.muted} data-legend-tick={i === 0 ? "min" : i === 1 ? "max" : "unity"} />
          ))}
        </g>
      )}
    </svg>
  );
}

function Line({ s }: { s: Segment }) {
  return <line x1={r(s.x1)} y1={r(s.y1)} x2={r(s.x2)} y2={r(s.y2)} />;
}

function Text({ m, fill, weight, ...rest }: { m: TextMark; fill: string; weight?: number; "data-legend-tick"?: string }) {
  return (
    <text
      x={r(m.x)}
      y={r(m.y)}
      fontSize={r(m.size)}
      fontWeight={weight}
      fill={fill}
      stroke="none"
      textAnchor={m.anchor ?? "middle"}
      dominantBaseline="central"
      transform={m.rotate ? `rotate(${m.rotate} ${r(m.x)} ${r(m.y)})` : undefined}
      {...rest}
    >
      {m.text}
    </text>
  );
}

/** Coordinates to 0.001 mm: exact enough, and keeps the markup short. */
function r(v: number): number {
  return Math.round(v * 1000) / 1000;
}
