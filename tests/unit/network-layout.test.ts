import { readFileSync } from "node:fs";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { NetworkDiagram } from "@/components/sheets/pictures/network-diagram";
import {
  colourScale,
  countCrossings,
  layoutNetwork,
  luminance,
  networkColour,
  NETWORK_DRAW_LIMIT,
  noCurrentMask,
  scaleColour,
  segmentValues,
  topologyFromKey,
  topologyKey,
  topologyOf,
  type Topology,
} from "@/components/sheets/pictures/network-layout";
import { loadChoices, networkPathSeries, networkPathSummary } from "@/components/sheets/pictures/network-path-series";
import { solveNetwork, type NetworkInput } from "@/lib/engine/network";
import { networkDrawing } from "@/lib/pdf/network-drawing";

const fixture = JSON.parse(readFileSync(path.join(__dirname, "../engine/fixtures/bus-network.json"), "utf8")) as NetworkInput;

/** A radial panel: a bus of `bays` sections, each bay feeding `drops` loads, some unloaded spare ways. */
function radial(bays: number, drops: number): Topology {
  const nodes = ["in"];
  const segments: Topology["segments"] = [];
  const loads: string[] = [];
  let prev = "in";
  for (let b = 0; b < bays; b++) {
    const bus = `B${b}`;
    nodes.push(bus);
    segments.push({ id: `bus-${b}`, from: prev, to: bus, length_m: 0.5 });
    for (let d = 0; d < drops; d++) {
      const m = `M${b}-${d}`;
      nodes.push(m);
      segments.push({ id: `f-${b}-${d}`, from: bus, to: m, length_m: 10 });
      if (d % 3 !== 2) loads.push(m);
    }
    prev = bus;
  }
  return { nodes, segments, supplies: ["in"], loads };
}

/** A meshed grid of w × h nodes fed at one corner (every interior link closes a mesh). */
function grid(w: number, h: number): Topology {
  const nodes: string[] = [];
  const segments: Topology["segments"] = [];
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      nodes.push(`n${x}-${y}`);
      if (x > 0) segments.push({ id: `h${x}-${y}`, from: `n${x - 1}-${y}`, to: `n${x}-${y}`, length_m: 1 });
      if (y > 0) segments.push({ id: `v${x}-${y}`, from: `n${x}-${y - 1}`, to: `n${x}-${y}`, length_m: 1 });
    }
  return { nodes, segments, supplies: ["n0-0"], loads: [nodes[nodes.length - 1]!] };
}

describe("network layout", () => {
  it("is deterministic: the same topology gives the same drawing", () => {
    const t = radial(6, 4);
    expect(JSON.stringify(layoutNetwork(t).segments)).toBe(JSON.stringify(layoutNetwork(structuredClone(t)).segments));
    expect(JSON.stringify(layoutNetwork(t).nodes)).toBe(JSON.stringify(layoutNetwork(t).nodes));
  });

  it("places every node inside the unit box, supplies in the left column", () => {
    for (const t of [topologyOf(fixture), radial(8, 5), grid(12, 9)]) {
      const L = layoutNetwork(t);
      expect(L.nodes).toHaveLength(t.nodes.length);
      for (const n of L.nodes) {
        expect(n.x).toBeGreaterThanOrEqual(0);
        expect(n.x).toBeLessThanOrEqual(1);
        expect(n.y).toBeGreaterThanOrEqual(0);
        expect(n.y).toBeLessThanOrEqual(1);
      }
      for (const s of L.segments) for (const [x, y] of s.points) expect(x >= 0 && x <= 1 && y >= 0 && y <= 1).toBe(true);
      for (const n of L.nodes.filter((n) => n.role === "supply")) expect(n.x).toBe(0);
      // no two nodes on the same spot
      expect(new Set(L.nodes.map((n) => `${n.x} ${n.y}`)).size).toBe(L.nodes.length);
    }
  });

  it("lays the fixture out by hops from the supply, the main bus on one row, without crossings", () => {
    const L = layoutNetwork(topologyOf(fixture));
    const at = (id: string) => L.nodes[L.nodeIndex.get(id)!]!;
    expect(at("incomer").layer).toBe(0);
    expect(at("B1").layer).toBe(1);
    expect(at("B2").layer).toBe(2);
    expect(at("M3").layer).toBe(4);
    expect(new Set(["incomer", "B1", "B2", "B3"].map((id) => at(id).row)).size).toBe(1);
    expect(at("M1").role).toBe("load");
    expect(L.segments.every((s) => s.tree)).toBe(true);
    expect(countCrossings(L)).toBe(0);
  });

  it("draws any tree without crossings", () => {
    expect(countCrossings(layoutNetwork(radial(10, 6)))).toBe(0);
    // a random tree, fixed seed
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const nodes = Array.from({ length: 120 }, (_, i) => `n${i}`);
    const segments = nodes.slice(1).map((id, i) => ({ id: `s${i}`, from: nodes[Math.floor(rnd() * (i + 1))]!, to: id, length_m: 1 }));
    expect(countCrossings(layoutNetwork({ nodes, segments, supplies: ["n0"], loads: [] }))).toBe(0);
  });

  it("draws mesh links and a second link between the same two nodes apart from the tree", () => {
    const t = grid(4, 3);
    t.segments.push({ id: "twin", from: "n0-0", to: "n1-0", length_m: 1 });
    const L = layoutNetwork(t);
    const tree = L.segments.filter((s) => s.tree).length;
    expect(tree).toBe(t.nodes.length - 1);
    const a = L.segments.find((s) => s.id === "h1-0")!;
    const b = L.segments.find((s) => s.id === "twin")!;
    expect(JSON.stringify(a.points)).not.toBe(JSON.stringify(b.points));
  });

  it("places unreached nodes below the supplied part, marked as unreached", () => {
    const t = radial(2, 2);
    t.nodes.push("lost-1", "lost-2");
    t.segments.push({ id: "lost", from: "lost-1", to: "lost-2", length_m: 1 });
    const L = layoutNetwork(t);
    const lost = L.nodes.filter((n) => !n.reached).map((n) => n.id);
    expect(lost).toEqual(["lost-1", "lost-2"]);
    const maxReachedRow = Math.max(...L.nodes.filter((n) => n.reached).map((n) => n.row));
    expect(Math.min(...L.nodes.filter((n) => !n.reached).map((n) => n.row))).toBeGreaterThan(maxReachedRow);
  });

  it("keys the layout on topology only: a length change keeps the key, a new link changes it", () => {
    const t = topologyOf(fixture);
    const longer = topologyOf({ ...fixture, segments: fixture.segments.map((s) => ({ ...s, length_m: Number(s.length_m) * 2 })) });
    expect(topologyKey(longer)).toBe(topologyKey(t));
    expect(topologyFromKey(topologyKey(t)).segments.map((s) => s.id)).toEqual(t.segments.map((s) => s.id));
    const linked = topologyOf({ ...fixture, segments: [...fixture.segments, { id: "tie", from: "M1", to: "M2", conductor: "tap", length_m: 3 }] });
    expect(topologyKey(linked)).not.toBe(topologyKey(t));
  });

  it("reads half-typed input without throwing", () => {
    const t = topologyOf({ nodes: [{ id: "a" }, {}, null, { id: " " }], segments: [{ id: "s", from: "a", to: "x" }, 3], supplies: "no" });
    expect(t.nodes).toEqual(["a"]);
    const L = layoutNetwork(t);
    expect(L.segments[0]!.points).toEqual([]);
  });

  it(`lays out ${NETWORK_DRAW_LIMIT} segments quickly (time printed, not asserted)`, () => {
    const big = radial(500, 9); // 500 bus sections + 4500 drops = 5000 segments
    big.segments.push(...grid(1, 1).segments);
    expect(big.segments.length).toBe(NETWORK_DRAW_LIMIT);
    const t0 = performance.now();
    const L = layoutNetwork(big);
    const ms = performance.now() - t0;
    const meshed = grid(71, 36); // 71·35 + 70·36 = 5005 segments, most closing meshes
    const t1 = performance.now();
    layoutNetwork(meshed);
    const ms2 = performance.now() - t1;
    const t2 = performance.now();
    layoutNetwork(big);
    const warm = performance.now() - t2;
    console.log(`layout of ${big.segments.length} radial segments: ${ms.toFixed(1)} ms cold, ${warm.toFixed(1)} ms warm; ${meshed.segments.length} meshed segments: ${ms2.toFixed(1)} ms`);
    expect(L.nodes.every((n) => n.x >= 0 && n.x <= 1 && n.y >= 0 && n.y <= 1)).toBe(true);
  });
});

describe("network colour scales", () => {
  const result = solveNetwork(fixture);
  const r = result.results;

  it("darkens monotonically from the first colour to the last", () => {
    let prev = Infinity;
    for (let k = 0; k <= 100; k++) {
      const l = luminance(networkColour(k / 100));
      expect(l).toBeLessThanOrEqual(prev + 1e-9);
      prev = l;
    }
    expect(networkColour(-1)).toBe(networkColour(0));
    expect(networkColour(Number.NaN)).toBe(networkColour(0));
    expect(networkColour(2)).toBe(networkColour(1));
  });

  it("orders segment colours by their values (hotter is darker; lower voltage is darker)", () => {
    for (const mode of ["rise", "density", "voltage"] as const) {
      const v = segmentValues(mode, r, "metric", 230);
      const s = colourScale(mode, v, "metric");
      const idx = [...v.keys()].filter((k) => Number.isFinite(v[k]!)).sort((a, b) => v[a]! - v[b]!);
      const lum = idx.map((k) => luminance(scaleColour(s, v[k]!)));
      for (let i = 1; i < lum.length; i++) {
        if (mode === "voltage") expect(lum[i]!).toBeGreaterThanOrEqual(lum[i - 1]! - 1e-9);
        else expect(lum[i]!).toBeLessThanOrEqual(lum[i - 1]! + 1e-9);
      }
    }
  });

  it("puts legend ticks on round values inside the range, covering every value", () => {
    for (const mode of ["rise", "density", "voltage", "voltage-pct"] as const) {
      const v = segmentValues(mode, r, "metric", 230);
      const s = colourScale(mode, v, "metric");
      const [lo, hi] = s.domain;
      for (const x of v) if (Number.isFinite(x)) expect(x >= lo - 1e-9 && x <= hi + 1e-9).toBe(true);
      expect(s.ticks.length).toBeGreaterThanOrEqual(2);
      for (const t of s.ticks) {
        expect(t.value).toBeGreaterThanOrEqual(lo - 1e-9);
        expect(t.value).toBeLessThanOrEqual(hi + 1e-9);
        expect(t.at).toBeGreaterThanOrEqual(0);
        expect(t.at).toBeLessThanOrEqual(1);
      }
    }
    // rise and density start at zero: 17.8 K → 0 … 20 K
    const rise = colourScale("rise", segmentValues("rise", r, "metric"), "metric");
    expect(rise.domain).toEqual([0, 20]);
    expect(rise.unit).toBe("K");
  });

  it("shows density in A/in² and rise in °F on imperial projects", () => {
    const m = segmentValues("density", r, "metric");
    const i = segmentValues("density", r, "imperial");
    expect(i[0]! / m[0]!).toBeCloseTo(645.16, 6); // 1 in² = 645.16 mm² (exact)
    expect(colourScale("density", i, "imperial").unit).toBe("A/in²");
    expect(segmentValues("rise", r, "imperial")[4]! / segmentValues("rise", r, "metric")[4]!).toBeCloseTo(1.8, 9);
  });

  it("marks the segments of a dead end as carrying no current", () => {
    const withSpare: NetworkInput = { ...fixture, nodes: [...fixture.nodes, { id: "spare" }], segments: [...fixture.segments, { id: "spare-way", from: "B3", to: "spare", conductor: "tap", length_m: 4 }] };
    const res = solveNetwork(withSpare).results;
    const mask = noCurrentMask(res);
    expect(res.segments.filter((_, k) => mask[k]).map((s) => s.id)).toEqual(["spare-way"]);
  });
});

describe("network pictures", () => {
  const result = solveNetwork(fixture);
  const r = result.results;

  it("draws the diagram as an image with a summary, dead branches dashed and overloads marked", () => {
    const over: NetworkInput = {
      ...fixture,
      nodes: [...fixture.nodes, { id: "spare" }],
      segments: [...fixture.segments, { id: "spare-way", from: "B3", to: "spare", conductor: "tap", length_m: 4 }],
      loads: fixture.loads!.map((l) => (l.node === "M2" ? { ...l, current_A: 200 } : l)),
    };
    const res = solveNetwork(over).results;
    const html = renderToStaticMarkup(createElement(NetworkDiagram, { input: over, results: res, unitSystem: "metric" }));
    expect(html).toContain('role="img"');
    expect(html).toContain('data-testid="network-diagram"');
    expect(html).toMatch(/aria-label="Bus network diagram: 8 nodes and 7 segments fed from incomer, 3 loads; coloured by temperature rise/);
    expect(html).toMatch(/<g data-segment="spare-way" data-dead="">.*?stroke-dasharray="5 4"/);
    expect(html).toMatch(/<g data-segment="feeder-2"[^>]*data-over=""/);
    expect(html).toContain("1 segment over ampacity");
    expect(html).toContain(">incomer<");
    expect(html).toContain('data-legend-tick="0"');
  });

  it("says when the network is too large to draw", () => {
    const big = radial(600, 9);
    const input = { ...fixture, nodes: big.nodes.map((id) => ({ id })), segments: big.segments.map((s) => ({ ...s, conductor: "tap" })), supplies: [{ node: "in", voltage_V: 230 }], loads: [] } as NetworkInput;
    const html = renderToStaticMarkup(createElement(NetworkDiagram, { input, results: r, unitSystem: "metric" }));
    expect(html).toMatch(/6,000 segments, more than the 5,000 the diagram draws/);
    expect(html).not.toContain('data-testid="network-diagram"');
    expect(networkDrawing(input as unknown as Record<string, unknown>, r, "metric")).toBeNull();
  });

  it("follows the path from the supply to the lowest load voltage", () => {
    const choices = loadChoices(fixture, r);
    expect(choices[0]!.node).toBe("M2");
    const s = networkPathSeries(fixture, r, "M2", "metric");
    if ("error" in s) throw new Error(s.error);
    expect(s.route).toEqual(["incomer", "B1", "B2", "M2"]);
    expect(s.length).toBeCloseTo(19.2, 9); // 0.6 + 0.6 + 18 m
    expect(s.limit).toBeCloseTo(230 * 0.99, 9);
    expect(networkPathSummary(s)).toMatch(/^incomer → B1 → B2 → M2: 3 segments, 19\.2 m, drop 0\.898 V \(0\.39 %\)/);
    const ft = networkPathSeries(fixture, r, "M2", "imperial");
    if ("error" in ft) throw new Error(ft.error);
    expect(ft.length).toBeCloseTo(19.2 / 0.3048, 6);
  });

  it("draws the network for the PDF with a legend and the worst path", () => {
    const node = networkDrawing(fixture as unknown as Record<string, unknown>, r, "metric");
    expect(node).not.toBeNull();
    const json = JSON.stringify(node);
    expect(json).toContain("Temperature rise (K)");
    expect(json).toContain("incomer → B1 → B2 → M2");
  });
});
