import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { BarCrossSection } from "@/components/sheets/pictures/bar-cross-section";
import { crossSectionLayout, lengthLabel, niceBelow } from "@/components/sheets/pictures/cross-section-layout";
import { densityColour } from "@/components/sheets/pictures/density-colours";
import { densityStops } from "@/components/sheets/pictures/palette";
import {
  firstCrossing,
  interpolateAt,
  niceAxis,
  pathSharesFromParallel,
  toPathShareRows,
  toTemperatureSeries,
  toVoltageSeries,
  worstContingencyIndex,
} from "@/components/sheets/pictures/series";
import { barArrangementAc } from "@/lib/engine/filament";
import { sig } from "@/lib/engine/format";
import type { BarArrangement } from "@/lib/engine/geometry";
import { parallelSharing } from "@/lib/engine/parallel";

const threePhase: BarArrangement = {
  barWidth_m: 0.1,
  barThickness_m: 0.01,
  barsPerPhase: 2,
  gap_m: 0.01,
  phases: 3,
  phaseSpacing_m: 0.2,
  orientation: "edge",
};

/** Resistivity of annealed copper near 80 °C, Ω·m (only the shape of the density matters here). */
const RHO = 2.1e-8;

function render(props: Parameters<typeof BarCrossSection>[0]): string {
  return renderToStaticMarkup(createElement(BarCrossSection, props));
}

/** The attributes of every bar rectangle (data-bar marks them). */
function barRects(svg: string): { x: number; y: number; width: number; height: number }[] {
  return [...svg.matchAll(/<rect data-bar="[^"]+" x="([^"]+)" y="([^"]+)" width="([^"]+)" height="([^"]+)"/g)].map((m) => ({
    x: Number(m[1]),
    y: Number(m[2]),
    width: Number(m[3]),
    height: Number(m[4]),
  }));
}

function viewBox(svg: string): number[] {
  const m = /viewBox="([^"]+)"/.exec(svg);
  return m![1]!.split(" ").map(Number);
}

function legendTick(svg: string, which: string): string | undefined {
  return new RegExp(`data-legend-tick="${which}"[^>]*>([^<]*)<`).exec(svg)?.[1];
}

describe("BarCrossSection: a scaled drawing of the arrangement", () => {
  const ac = barArrangementAc(threePhase, 50, RHO);

  it("draws every bar of every phase", () => {
    expect(barRects(render({ arrangement: threePhase }))).toHaveLength(6);
    expect(barRects(render({ arrangement: { ...threePhase, barsPerPhase: 3, orientation: "flat" } }))).toHaveLength(9);
    expect(barRects(render({ arrangement: { ...threePhase, barsPerPhase: 1, phases: 1 } }))).toHaveLength(1);
  });

  it("draws to scale: 1 unit = 1 mm, so a 100 mm bar is twice as tall as a 50 mm one", () => {
    const tall = barRects(render({ arrangement: threePhase }));
    const short = barRects(render({ arrangement: { ...threePhase, barWidth_m: 0.05 } }));
    expect(tall[0]!.height).toBeCloseTo(100, 6);
    expect(short[0]!.height).toBeCloseTo(50, 6);
    expect(tall[0]!.height / short[0]!.height).toBeCloseTo(2, 9);
    expect(tall[0]!.width).toBeCloseTo(10, 6);
    // Bars lying flat: the width runs across the page.
    const flat = barRects(render({ arrangement: { ...threePhase, orientation: "flat" } }));
    expect(flat[0]!.width).toBeCloseTo(100, 6);
    expect(flat[0]!.height).toBeCloseTo(10, 6);
  });

  it("places the bars at their real pitch: gap between bars and phase spacing centre to centre", () => {
    const r = barRects(render({ arrangement: threePhase }));
    expect(r[1]!.x - (r[0]!.x + r[0]!.width)).toBeCloseTo(10, 6); // gap 10 mm
    const packCentre = (k: number) => (r[2 * k]!.x + r[2 * k + 1]!.x + r[2 * k + 1]!.width) / 2;
    expect(packCentre(1) - packCentre(0)).toBeCloseTo(200, 6);
    expect(packCentre(2) - packCentre(1)).toBeCloseTo(200, 6);
  });

  it("has a viewBox proportional to the arrangement's extent that holds every bar", () => {
    const a = viewBox(render({ arrangement: threePhase }));
    const doubled: BarArrangement = { ...threePhase, barWidth_m: 0.2, barThickness_m: 0.02, gap_m: 0.02, phaseSpacing_m: 0.4 };
    const b = viewBox(render({ arrangement: doubled }));
    // The markup rounds coordinates to 0.001 mm; the layout itself scales exactly.
    for (let i = 0; i < 4; i++) expect(b[i]! / a[i]!).toBeCloseTo(2, 3);
    const la = crossSectionLayout(threePhase).viewBox;
    const lb = crossSectionLayout(doubled).viewBox;
    for (const k of ["x", "y", "w", "h"] as const) expect(lb[k] / la[k]).toBeCloseTo(2, 9);
    const [x, y, w, h] = a as [number, number, number, number];
    for (const bar of barRects(render({ arrangement: threePhase }))) {
      expect(bar.x).toBeGreaterThanOrEqual(x);
      expect(bar.y).toBeGreaterThanOrEqual(y);
      expect(bar.x + bar.width).toBeLessThanOrEqual(x + w);
      expect(bar.y + bar.height).toBeLessThanOrEqual(y + h);
    }
    // The drawing is wider than tall, like the row of packs it shows (430 mm × 100 mm of bars).
    expect(w).toBeGreaterThan(h);
  });

  it("colours one cell per filament and shows the density range in the legend", () => {
    const svg = render({ arrangement: threePhase, density: ac.density, frequency_Hz: 50 });
    const values = ac.density.map((d) => d.jMagnitudeRelative);
    expect(legendTick(svg, "min")).toBe(sig(Math.min(...values), 3));
    expect(legendTick(svg, "max")).toBe(sig(Math.max(...values), 3));
    // Proximity effect at 50 Hz: the density is far from uniform (Rac/Rdc ≈ 1.3–1.4 here).
    expect(Math.max(...values) / Math.min(...values)).toBeGreaterThan(2);
    expect(crossSectionLayout(threePhase, { density: ac.density }).cells).toHaveLength(ac.density.length);
    expect(svg).toContain("data-layer=\"legend\"");
  });

  it("shows a plain DC view without a legend when no density is given", () => {
    const svg = render({ arrangement: threePhase });
    expect(svg).not.toContain("data-layer=\"legend\"");
    expect(svg).toContain("DC view");
  });

  it("labels phases and dimensions in mm or in", () => {
    const metric = render({ arrangement: threePhase });
    for (const label of ["L1", "L2", "L3", "100 mm", "10 mm", "200 mm"]) expect(metric).toContain(`>${label}<`);
    const imperial = render({ arrangement: threePhase, units: "imperial" });
    expect(imperial).toContain(">3.937 in<"); // 100 mm / 25.4
    expect(imperial).toContain(">7.874 in<"); // 200 mm / 25.4
    expect(imperial).not.toContain(" mm<");
    expect(render({ arrangement: { ...threePhase, phases: 2 } })).toContain(">N<");
    expect(lengthLabel(0.0125, "metric")).toBe("12.5 mm");
  });

  it("is an image with a title and a summary for screen readers", () => {
    const svg = render({ arrangement: threePhase, density: ac.density, frequency_Hz: 50 });
    expect(svg).toMatch(/^<svg role="img" aria-label="Scaled cross-section of a three-phase busbar arrangement/);
    expect(svg).toContain("<title>Scaled cross-section");
    expect(svg).toContain("at 50 Hz");
  });

  it("draws a scale bar of a round length", () => {
    const L = crossSectionLayout(threePhase);
    expect(L.scaleBar.length).toBe(100); // largest 1-2-5 step ≤ 0.4 × 430 mm
    expect(L.scaleBar.labels[1]!.text).toBe("100 mm");
    expect(niceBelow(172)).toBe(100);
    expect(niceBelow(0.45)).toBe(0.2);
    const inch = crossSectionLayout(threePhase, { units: "imperial" }).scaleBar;
    expect(inch.length).toBeCloseTo(5 * 25.4, 9); // 0.4 × 430 mm = 6.77 in → 5 in
  });

  it("maps density to colour from the first stop to the last, clamped", () => {
    expect(densityColour(0)).toBe(densityStops[0]);
    expect(densityColour(1)).toBe(densityStops[densityStops.length - 1]);
    expect(densityColour(-3)).toBe(densityStops[0]);
    expect(densityColour(Number.NaN)).toBe(densityStops[0]);
  });
});

describe("chart data: temperature against current", () => {
  const pts = [
    { current_A: 2000, temperature_C: 100 },
    { current_A: 0, temperature_C: 40 },
    { current_A: 1000, temperature_C: 60 },
  ];

  it("sorts by current, reads the operating point and where the curve meets the limit", () => {
    const s = toTemperatureSeries(pts, { limit_C: 90, designCurrent_A: 1500 });
    expect(s.data.map((d) => d.current)).toEqual([0, 1000, 2000]);
    expect(s.tempUnit).toBe("°C");
    // Linear between (1000, 60) and (2000, 100): 80 °C at 1500 A, 90 °C at 1750 A.
    expect(s.operating).toEqual({ current: 1500, temperature: 80, withinLimit: true });
    expect(s.rating!.current).toBeCloseTo(1750, 9);
    expect(s.yDomain[0]).toBeLessThanOrEqual(40);
    expect(s.yDomain[1]).toBeGreaterThanOrEqual(100);
    expect(s.xDomain[0]).toBe(0);
  });

  it("converts to °F for imperial sheets at the edge (°F = °C·9/5 + 32)", () => {
    const s = toTemperatureSeries(pts, { limit_C: 90, designCurrent_A: 1500, units: "imperial" });
    expect(s.tempUnit).toBe("°F");
    expect(s.limit).toBeCloseTo(194, 9);
    expect(s.data[0]!.temperature).toBeCloseTo(104, 9);
    expect(s.operating!.temperature).toBeCloseTo(176, 9);
    expect(s.rating!.current).toBeCloseTo(1750, 9); // the crossing does not move with the unit
  });

  it("flags an operating point above the limit and skips points that are not numbers", () => {
    const s = toTemperatureSeries([...pts, { current_A: Number.NaN, temperature_C: 1 }], { limit_C: 70, designCurrent_A: 1500 });
    expect(s.data).toHaveLength(3);
    expect(s.operating!.withinLimit).toBe(false);
    expect(toTemperatureSeries(pts, { designCurrent_A: 5000 }).operating).toBeUndefined(); // off the curve
  });

  it("interpolates and finds crossings on a polyline", () => {
    expect(interpolateAt([0, 10], [0, 100], 2.5)).toBe(25);
    expect(interpolateAt([0, 10], [0, 100], 11)).toBeUndefined();
    expect(firstCrossing([0, 10, 20], [0, 50, 150], 100)).toBe(15);
    expect(firstCrossing([0, 10], [120, 150], 100)).toBeUndefined();
  });

  it("puts ticks on round values", () => {
    expect(niceAxis([0, 0.3]).ticks).toEqual([0, 0.1, 0.2, 0.3]);
    expect(niceAxis([0, 2870], 6)).toEqual({ domain: [0, 3000], ticks: [0, 500, 1000, 1500, 2000, 2500, 3000] });
  });
});

describe("chart data: voltage along the route", () => {
  const profile = [
    { distance_m: 0, voltage_V: 400, label: "MSB" },
    { distance_m: 45, voltage_V: 394 },
    { distance_m: 45, voltage_V: 392.5, label: "DB-1" },
    { distance_m: 100, voltage_V: 385 },
  ];

  it("keeps points at one distance in their order so a step stays a step", () => {
    const s = toVoltageSeries(profile, { limitVoltage_V: 388 });
    expect(s.data.map((d) => d.voltage)).toEqual([400, 394, 392.5, 385]);
    expect(s.data[2]!.label).toBe("DB-1");
    expect(s.receiving).toEqual({ distance: 100, voltage: 385 });
    expect(s.withinLimit).toBe(false);
    expect(s.yDomain[0]).toBeLessThanOrEqual(385);
    expect(s.xDomain).toEqual([0, 100]);
  });

  it("shows distance in feet on imperial sheets (1 ft = 0.3048 m)", () => {
    const s = toVoltageSeries(profile, { units: "imperial" });
    expect(s.distUnit).toBe("ft");
    expect(s.receiving!.distance).toBeCloseTo(100 / 0.3048, 9);
    expect(s.withinLimit).toBeUndefined();
  });
});

describe("chart data: current per parallel path", () => {
  const paths = [
    { name: "A", current_A: 410, ampacity_A: 450, share: 0.34 },
    { name: "B", current_A: 395, ampacity_A: 380, share: 0.33 },
    { name: "C", current_A: 395, share: 0.33 },
  ];

  it("marks the overloaded paths and lines up the contingency currents", () => {
    const rows = toPathShareRows(paths, { openPath: "A", currents: [0, 600, 600] });
    expect(rows.map((r) => r.overloaded)).toEqual([false, true, false]);
    expect(rows[0]!.utilisation).toBeCloseTo(410 / 450, 12);
    expect(rows[2]!.ampacity).toBeUndefined();
    expect(rows.map((r) => r.contingency)).toEqual([0, 600, 600]);
    expect(rows.map((r) => r.isOpen)).toEqual([true, false, false]);
    expect(rows.map((r) => r.contingencyOverloaded)).toEqual([false, true, false]);
  });

  it("picks the contingency that loads a path hardest against its ampacity", () => {
    const cases = [
      { openPath: "A", currents: [0, 500, 700] }, // B at 500/380 = 1.32
      { openPath: "B", currents: [800, 0, 400] }, // A at 800/450 = 1.78
      { openPath: "C", currents: [600, 600, 0] }, // B at 600/380 = 1.58
    ];
    expect(worstContingencyIndex(paths, cases)).toBe(1);
    expect(worstContingencyIndex(paths, [])).toBe(-1);
  });

  it("reads its props from the parallel-sharing engine", () => {
    const cable = (name: string, length_m: number) => ({
      name,
      materialId: "cu-annealed" as const,
      area_m2: 240e-6,
      length_m,
      count: 2,
      conductorTemperature_C: 70,
      ampacityPerConductor_A: 300,
    });
    const input = { mode: "dc" as const, current_A: 1500, paths: [cable("P1", 40), cable("P2", 40), cable("P3", 60)] };
    const r = parallelSharing(input).results;
    const { paths: p, contingency } = pathSharesFromParallel(r, input.paths);
    expect(p.map((x) => x.ampacity_A)).toEqual([600, 600, 600]);
    expect(p.reduce((s, x) => s + x.current_A, 0)).toBeCloseTo(1500, 6); // Kirchhoff: DC currents add up
    expect(p.reduce((s, x) => s + x.share, 0)).toBeCloseTo(1, 9);
    // Without the input the ampacity is read back from I/I_z.
    const back = pathSharesFromParallel(r);
    back.paths.forEach((x) => expect(x.ampacity_A!).toBeCloseTo(600, 6));
    expect(contingency).toHaveLength(3);
    expect(contingency[0]!.currents[0]).toBe(0);
    expect(contingency[0]!.currents[1]! + contingency[0]!.currents[2]!).toBeCloseTo(1500, 6);
  });
});
