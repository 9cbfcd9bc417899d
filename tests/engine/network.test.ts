import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { IslandError, networkInputErrors, networkInputSchema, pathBetween, readNetworkTables, solveNetwork, type NetworkInput } from "../../lib/engine/network";
import { EngineError } from "../../lib/engine/core/result";
import { fieldErrors } from "../../lib/engine/core/schema";
import { barTemperatureForCurrent, prepareBusbar } from "../../lib/engine/busbar-thermal";
import { emissivity } from "../../lib/engine/materials";

/**
 * Conductor with r' = 1e-5 Ω/m at 20 °C: annealed copper ρ20 = 1.7241e-8 Ω·m
 * (IEC 60287-1-1:2006 Table 1) over A = 1.7241e-3 m². So 100 m = 1 mΩ.
 */
const CU = { id: "cu", materialId: "cu-annealed" as const, area_m2: 1.7241e-3, conductorTemperature_C: 20 };

const seg = (id: string, from: string, to: string, length_m: number, conductor = "cu") => ({ id, from, to, conductor, length_m });
const nodes = (...ids: string[]) => ids.map((id) => ({ id }));

/**
 * Hand-solved ladder with one loop and a loaded end:
 *   S–A 1 mΩ, A–B 1 mΩ, S–B 2 mΩ, B–C 1 mΩ; loads A 30 A, C 60 A; S held at 400 V.
 * With u = V_S − V in mV and R in mΩ (so ΔV/R is in A):
 *   node A: u_A/1 + (u_A − u_B)/1 = 30        → 2u_A − u_B = 30
 *   node B: u_B/2 + (u_B − u_A)/1 = 60 (to C) → −u_A + 1.5u_B = 60
 *   ⇒ u_A = 52.5 mV, u_B = 75 mV, u_C = 75 + 60·1 = 135 mV
 *   currents: S→A 52.5 A, S→B 37.5 A, A→B 22.5 A, B→C 60 A
 *   loss = 52.5²·1e-3 + 37.5²·2e-3 + 22.5²·1e-3 + 60²·1e-3 = 9.675 W
 * Plus a dead-end branch A–E–F with no load (no outlet: zero current).
 */
const ladder = (mode: "dc" | "ac"): NetworkInput => ({
  mode,
  conductors: [CU],
  nodes: nodes("S", "A", "B", "C", "E", "F"),
  segments: [seg("SA", "S", "A", 100), seg("AB", "A", "B", 100), seg("SB", "S", "B", 200), seg("BC", "B", "C", 100), seg("AE", "A", "E", 50), seg("EF", "E", "F", 70)],
  supplies: [{ node: "S", voltage_V: 400 }],
  loads: [
    { node: "A", current_A: 30 },
    { node: "C", current_A: 60 },
  ],
});

function signedDc(r: ReturnType<typeof solveNetwork>, id: string): number {
  const s = r.results.segments.find((x) => x.id === id)!;
  return s.direction * s.current_A;
}

describe("bus network: hand-solved ladder (nodal analysis)", () => {
  const r = solveNetwork(ladder("dc"));
  const v = (id: string) => r.results.nodes.find((x) => x.id === id)!.voltage_V!;

  it("node voltages", () => {
    expect(v("S")).toBe(400);
    expect(v("A")).toBeCloseTo(400 - 0.0525, 10);
    expect(v("B")).toBeCloseTo(400 - 0.075, 10);
    expect(v("C")).toBeCloseTo(400 - 0.135, 10);
    expect(r.results.maxDrop!.node).toBe("C");
    expect(r.results.maxDrop!.drop_V).toBeCloseTo(0.135, 10);
  });

  it("segment currents with direction, losses, supply current", () => {
    expect(signedDc(r, "SA")).toBeCloseTo(52.5, 8);
    expect(signedDc(r, "SB")).toBeCloseTo(37.5, 8);
    expect(signedDc(r, "AB")).toBeCloseTo(22.5, 8);
    expect(signedDc(r, "BC")).toBeCloseTo(60, 8);
    expect(r.results.totalLoss_W).toBeCloseTo(9.675, 8);
    expect(r.results.supplies[0]!.current_A).toBeCloseTo(90, 8);
  });

  it("the dead-end branch carries exactly zero current and sits at its junction's potential", () => {
    expect(r.results.segments.find((x) => x.id === "AE")!.current_A).toBe(0);
    expect(r.results.segments.find((x) => x.id === "EF")!.current_A).toBe(0);
    expect(r.results.segments.find((x) => x.id === "EF")!.direction).toBe(0);
    expect(v("E")).toBe(v("A"));
    expect(v("F")).toBe(v("A"));
    expect(r.results.deadEndNodes).toBe(2);
  });

  it("AC equals DC when reactance is 0 and pf = 1", () => {
    const a = solveNetwork(ladder("ac"));
    a.results.nodes.forEach((n, i) => expect(n.voltage_V!).toBeCloseTo(r.results.nodes[i]!.voltage_V!, 9));
    a.results.segments.forEach((s, i) => {
      expect(s.current_A).toBeCloseTo(r.results.segments[i]!.current_A, 8);
      expect(s.direction).toBe(r.results.segments[i]!.direction);
    });
    expect(a.results.totalLoss_W).toBeCloseTo(r.results.totalLoss_W, 9);
  });

  it("voltage along a path: fewest segments S → B → C with cumulative distance", () => {
    const path = pathBetween(ladder("dc"), "S", "C", r);
    expect(path.map((p) => p.node)).toEqual(["S", "B", "C"]);
    expect(path.map((p) => p.distance_m)).toEqual([0, 200, 300]);
    expect(path[2]!.voltage_V).toBeCloseTo(400 - 0.135, 10);
    expect(() => pathBetween(ladder("dc"), "S", "nowhere")).toThrow(EngineError);
  });
});

describe("bus network: a long uniformly loaded line", () => {
  it("5 000 equal loads on a chain: end drop = r·I·N(N + 1)/2, solved by the exact IC(0) factor", () => {
    // Segment j (from the supply) carries (N − j + 1)·I, so the drop at the end is
    // Σ_j r·(N − j + 1)·I = r·I·N(N + 1)/2 (uniformly distributed load, common practice).
    // r = 1e-5 Ω (1 m of the CU conductor), I = 1 A, N = 5000 → 1e-5·5000·5001/2 = 125.025 V.
    const N = 5000;
    const ids = Array.from({ length: N + 1 }, (_, i) => `n${i}`);
    const r = solveNetwork({
      mode: "dc",
      conductors: [CU],
      nodes: ids.map((id) => ({ id })),
      segments: ids.slice(1).map((id, j) => seg(`s${j}`, ids[j]!, id, 1)),
      supplies: [{ node: "n0", voltage_V: 400 }],
      loads: ids.slice(1).map((node) => ({ node, current_A: 1 })),
    });
    expect(r.results.maxDrop!.node).toBe(`n${N}`);
    expect(r.results.maxDrop!.drop_V).toBeCloseTo(125.025, 8);
    // IC(0) is the exact factor of a tree: one step, plus at most one residual-replacement step.
    expect(r.results.solver!.iterations).toBeLessThanOrEqual(2);
    expect(r.results.segments[0]!.current_A).toBeCloseTo(N, 8);
  });
});

describe("bus network: two supplies and AC phasors", () => {
  it("a load midway between two equal supplies is fed half from each (symmetry)", () => {
    const r = solveNetwork({
      mode: "dc",
      conductors: [CU],
      nodes: nodes("S1", "M", "S2"),
      segments: [seg("a", "S1", "M", 100), seg("b", "M", "S2", 100)],
      supplies: [
        { node: "S1", voltage_V: 230 },
        { node: "S2", voltage_V: 230 },
      ],
      loads: [{ node: "M", current_A: 100 }],
    });
    expect(r.results.supplies[0]!.current_A).toBeCloseTo(50, 9);
    expect(r.results.supplies[1]!.current_A).toBeCloseTo(50, 9);
    // drop at M: 50 A · 1 mΩ = 50 mV
    expect(r.results.nodes[1]!.drop_V).toBeCloseTo(0.05, 10);
  });

  it("single AC segment: V_end = V_s − I·(R + jX), lagging load", () => {
    // R = 1 mΩ, X = 2 mΩ (2e-5 Ω/m × 100 m); I = 100 A at pf 0.8 lagging: I = 80 − j60 A.
    // I·Z = (80 − j60)(0.001 + j0.002) = 0.08 + 0.12 + j(0.16 − 0.06) = 0.2 + j0.1 V
    // V_end = 400 − 0.2 − j0.1 → |V| = √(399.8² + 0.1²) ≈ 399.8 + 0.01/(2·399.8) = 399.8000125063 V
    const r = solveNetwork({
      mode: "ac",
      conductors: [{ ...CU, reactance_ohm_per_m: 2e-5 }],
      nodes: nodes("S", "L"),
      segments: [seg("s", "S", "L", 100)],
      supplies: [{ node: "S", voltage_V: 400 }],
      loads: [{ node: "L", current_A: 100, pf: 0.8 }],
    });
    expect(r.results.nodes[1]!.voltage_V).toBeCloseTo(399.8000125063, 9);
    expect(r.results.nodes[1]!.angle_deg).toBeCloseTo((Math.atan2(-0.1, 399.8) * 180) / Math.PI, 9);
    expect(r.results.segments[0]!.current_A).toBeCloseTo(100, 9);
    expect(r.results.segments[0]!.angle_deg).toBeCloseTo(-36.8699, 3);
    expect(r.results.totalLoss_W).toBeCloseTo(10, 9);
  });
});

/** Random connected network: a spanning tree plus extra (meshing) segments. */
const netArb = fc
  .record({
    mode: fc.constantFrom("dc" as const, "ac" as const),
    n: fc.integer({ min: 2, max: 60 }),
    extra: fc.integer({ min: 0, max: 30 }),
    supplies: fc.integer({ min: 1, max: 3 }),
    seed: fc.array(fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), { minLength: 400, maxLength: 400 }),
  })
  .map(({ mode, n, extra, supplies, seed }): NetworkInput => {
    let t = 0;
    const r = () => seed[t++ % seed.length]!;
    const ns = Array.from({ length: n }, (_, i) => ({ id: `N${i}` }));
    const segs = [];
    for (let i = 1; i < n; i++) segs.push(seg(`T${i}`, `N${i}`, `N${Math.floor(r() * i)}`, 0.1 + 20 * r(), r() < 0.5 ? "cu" : "al"));
    for (let e = 0; e < extra; e++) {
      const a = Math.floor(r() * n);
      const b = Math.floor(r() * n);
      if (a !== b) segs.push(seg(`X${e}`, `N${a}`, `N${b}`, 0.1 + 20 * r(), "cu"));
    }
    const sup = Array.from({ length: Math.min(supplies, n) }, (_, k) => ({ node: `N${k}`, voltage_V: 400 + (k ? r() : 0), angle_deg: mode === "ac" && k ? r() - 0.5 : 0 }));
    const loads = ns.filter(() => r() < 0.6).map((x) => ({ node: x.id, current_A: 500 * r(), pf: mode === "ac" ? 0.5 + 0.5 * r() : 1 }));
    return {
      mode,
      conductors: [
        { ...CU, reactance_ohm_per_m: mode === "ac" ? 1e-5 : 0 },
        { id: "al", materialId: "al-1350", area_m2: 1e-3, conductorTemperature_C: 60, reactance_ohm_per_m: mode === "ac" ? 2e-5 : 0 },
      ],
      nodes: ns,
      segments: segs,
      supplies: sup,
      loads,
    };
  });

function phasor(s: { current_A: number; angle_deg: number }): [number, number] {
  const a = (s.angle_deg * Math.PI) / 180;
  return [s.current_A * Math.cos(a), s.current_A * Math.sin(a)];
}

describe("bus network: invariants on random trees and meshes (fast-check)", () => {
  it("Kirchhoff's current law at every free node: Σ I_in = I_load (1e-9 of the total load)", () => {
    fc.assert(
      fc.property(netArb, (net) => {
        const r = solveNetwork(net).results;
        const inR = new Map<string, number>();
        const inI = new Map<string, number>();
        r.segments.forEach((s) => {
          const [cr, ci] = phasor(s);
          inR.set(s.to, (inR.get(s.to) ?? 0) + cr);
          inI.set(s.to, (inI.get(s.to) ?? 0) + ci);
          inR.set(s.from, (inR.get(s.from) ?? 0) - cr);
          inI.set(s.from, (inI.get(s.from) ?? 0) - ci);
        });
        const fed = new Set(net.supplies.map((s) => s.node));
        const total = (net.loads ?? []).reduce((a, l) => a + Number(l.current_A), 0) + 1;
        for (const nd of net.nodes) {
          if (fed.has(nd.id)) continue;
          const loads = (net.loads ?? []).filter((l) => l.node === nd.id);
          let lr = 0;
          let li = 0;
          for (const l of loads) {
            const pf = net.mode === "ac" ? Number(l.pf ?? 1) : 1;
            lr += Number(l.current_A) * pf;
            li -= Number(l.current_A) * Math.sqrt(1 - pf * pf);
          }
          expect(Math.hypot((inR.get(nd.id) ?? 0) - lr, (inI.get(nd.id) ?? 0) - li)).toBeLessThan(1e-9 * total);
        }
      }),
      { numRuns: 60 },
    );
  });

  it("power conservation: Σ losses + Σ load power = supply power", () => {
    fc.assert(
      fc.property(netArb, (net) => {
        const r = solveNetwork(net).results;
        const lossSum = r.segments.reduce((a, s) => a + s.loss_W, 0);
        expect(Math.abs(lossSum + r.loadPower_W - r.supplyPower_W)).toBeLessThan(1e-9 * Math.abs(r.supplyPower_W) + 1e-9);
      }),
      { numRuns: 60 },
    );
  });
});

describe("bus network: named errors and warnings", () => {
  it("a loaded island is the named error 'island' listing its nodes", () => {
    const net = ladder("dc");
    net.nodes.push({ id: "I1" }, { id: "I2" });
    net.segments.push(seg("I", "I1", "I2", 10));
    net.loads!.push({ node: "I2", current_A: 5 });
    try {
      solveNetwork(net);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(IslandError);
      expect((e as IslandError).code).toBe("island");
      expect((e as IslandError).islands).toEqual([["I1", "I2"]]);
    }
  });

  it("an unloaded isolated node gives a warning and no voltage", () => {
    const net = ladder("dc");
    net.nodes.push({ id: "lonely" });
    const r = solveNetwork(net);
    expect(r.warnings.map((w) => w.code)).toContain("isolated-nodes");
    expect(r.results.nodes.find((n) => n.id === "lonely")!.voltage_V).toBeNull();
    expect(r.results.isolatedNodes).toEqual(["lonely"]);
  });

  it("no supply is the named error 'no-supply'", () => {
    const net = { ...ladder("dc"), supplies: [] };
    expect(() => solveNetwork(net)).toThrow(expect.objectContaining({ code: "no-supply" }));
  });

  it("input errors name the field: duplicate ids, unknown nodes, zero length, unknown conductor", () => {
    const fieldOf = (net: NetworkInput) => {
      try {
        solveNetwork(net);
      } catch (e) {
        if (e instanceof EngineError) return e.message;
        throw e;
      }
      return "";
    };
    const base = ladder("dc");
    expect(fieldOf({ ...base, nodes: [...base.nodes, { id: "A" }] })).toMatch(/^nodes\.6\.id: node id "A" is used twice/);
    expect(fieldOf({ ...base, segments: [...base.segments, seg("Z", "A", "Q", 1)] })).toMatch(/^segments\.6\.to: to node "Q" is not in the node list/);
    expect(fieldOf({ ...base, segments: [...base.segments, seg("Z", "A", "B", 0)] })).toMatch(/^segments\.6\.length_m: length must be from 0.0001 to 10000 m/);
    expect(fieldOf({ ...base, segments: [...base.segments, seg("Z", "A", "B", 1, "steel")] })).toMatch(/^segments\.6\.conductor: conductor "steel"/);
    expect(fieldOf({ ...base, segments: [...base.segments, seg("SA", "A", "B", 1)] })).toMatch(/^segments\.6\.id: segment id "SA" is used twice/);
    expect(fieldOf({ ...base, loads: [{ node: "A", current_A: -1 }] })).toMatch(/^loads\.0\.current_A: load current must be from 0/);
  });
});

describe("bus network: segment temperature", () => {
  it("from an ampacity: θ = θa + (θmax − θa)(I/Iz)² (common practice)", () => {
    // Ladder B→C carries 60 A; Iz = 120 A: θ = 35 + 55·0.25 = 48.75 °C
    const net = ladder("dc");
    net.conductors = [{ ...CU, ampacity_A: 120 }];
    const r = solveNetwork(net);
    expect(r.results.segments.find((s) => s.id === "BC")!.temperature_C).toBeCloseTo(48.75, 8);
    expect(r.results.hottest[0]!.id).toBe("BC");
    expect(r.results.hottestBasis).toBe("temperature");
  });

  it("bar arrangement: tabulated temperatures agree with a direct heat-balance solve within the stated table error", () => {
    const arrangement = { barWidth_m: 0.06, barThickness_m: 0.01, barsPerPhase: 1, gap_m: 0.01, phases: 1 as const, phaseSpacing_m: 0.1, orientation: "edge" as const };
    const net: NetworkInput = {
      mode: "dc",
      ambient_C: 35,
      conductors: [{ id: "bar", materialId: "cu-etp", arrangement, conductorTemperature_C: 65 }],
      nodes: nodes("S", "A", "B"),
      segments: [seg("SA", "S", "A", 2, "bar"), seg("AB", "A", "B", 3, "bar")],
      supplies: [{ node: "S", voltage_V: 400 }],
      loads: [
        { node: "A", current_A: 400 },
        { node: "B", current_A: 500 },
      ],
    };
    const r = solveNetwork(net);
    const err = r.intermediates.thermalTableError!.value;
    expect(err).toBeLessThan(0.05);
    const p = prepareBusbar({ arrangement, materialId: "cu-etp", emissivity: emissivity("copper", "oxidised"), ambient_C: 35 });
    for (const id of ["SA", "AB"]) {
      const s = r.results.segments.find((x) => x.id === id)!;
      expect(Math.abs(s.temperature_C! - barTemperatureForCurrent(p, s.current_A))).toBeLessThanOrEqual(err + 1e-6);
    }
    expect(r.results.segments[0]!.current_A).toBeCloseTo(900, 8);
    expect(r.results.hottest[0]!.id).toBe("SA");
  });
});

/**
 * The solver reads the bulk arrays with its own pass (readNetworkTables) and falls back
 * to the exported zod schema whenever that pass finds a problem. The two must agree on
 * what is valid and read valid input to the same values; the messages are the schema's.
 */
describe("bus network: fast input pass against the zod schema", () => {
  /** The first field message of the schema, as solveNetwork reports it. */
  const zodFirst = (raw: unknown) => {
    const r = networkInputSchema.safeParse(raw);
    if (r.success) return null;
    const [field, message] = Object.entries(fieldErrors(r.error))[0]!;
    return { field, message };
  };
  const solverError = (raw: unknown) => {
    try {
      solveNetwork(raw as NetworkInput);
    } catch (e) {
      if (e instanceof EngineError && e.code === "invalid-input") return { field: e.field, message: e.message };
      if (e instanceof EngineError) return null;
      throw e;
    }
    return null;
  };
  function expectSameVerdict(raw: unknown) {
    const fast = readNetworkTables(raw);
    const z = networkInputSchema.safeParse(raw);
    expect(fast !== null, JSON.stringify(raw).slice(0, 300)).toBe(z.success);
    if (z.success) {
      // valid: the fast pass reads the raw input to what it reads from the schema's output
      expect(fast).toEqual(readNetworkTables(z.data));
      expect(networkInputErrors(raw)).toBeNull();
    } else {
      const first = zodFirst(raw)!;
      expect(solverError(raw)).toEqual({ field: first.field, message: `${first.field}: ${first.message}` });
      expect(networkInputErrors(raw)).toEqual(fieldErrors(z.error));
    }
  }

  const base = ladder("ac");
  const withSeg = (s: Record<string, unknown>) => ({ ...base, segments: [...base.segments, s] });
  const withLoad = (l: Record<string, unknown>) => ({ ...base, loads: [...base.loads!, l] });
  const BAD: [string, unknown][] = [
    ["duplicate node", { ...base, nodes: [...base.nodes, { id: "A" }] }],
    ["node id not text", { ...base, nodes: [...base.nodes, { id: 7 }] }],
    ["node id blank", { ...base, nodes: [...base.nodes, { id: "   " }] }],
    ["node id too long", { ...base, nodes: [...base.nodes, { id: "x".repeat(101) }] }],
    ["node null", { ...base, nodes: [...base.nodes, null] }],
    ["node array", { ...base, nodes: [...base.nodes, ["Z"]] }],
    ["nodes empty", { ...base, nodes: [] }],
    ["nodes not an array", { ...base, nodes: "S,A" }],
    ["segment to unknown node", withSeg(seg("Z", "A", "Q", 1))],
    ["segment joins a node to itself", withSeg(seg("Z", "A", " A ", 1))],
    ["segment unknown conductor", withSeg(seg("Z", "A", "B", 1, "steel"))],
    ["segment duplicate id", withSeg(seg("SA", "A", "B", 1))],
    ["segment length 0", withSeg(seg("Z", "A", "B", 0))],
    ["segment length NaN string", withSeg({ ...seg("Z", "A", "B", 1), length_m: "NaN" })],
    ["segment length abc", withSeg({ ...seg("Z", "A", "B", 1), length_m: "abc" })],
    ["segment length Infinity", withSeg({ ...seg("Z", "A", "B", 1), length_m: Infinity })],
    ["segment length 1e308", withSeg({ ...seg("Z", "A", "B", 1), length_m: 1e308 })],
    ["segment length hex", withSeg({ ...seg("Z", "A", "B", 1), length_m: "0x10" })],
    ["segment length empty", withSeg({ ...seg("Z", "A", "B", 1), length_m: "" })],
    ["segment length missing", withSeg({ id: "Z", from: "A", to: "B", conductor: "cu" })],
    ["segment reactance too large", withSeg({ ...seg("Z", "A", "B", 1), reactance_ohm_per_m: 1 })],
    ["segment reactance null", withSeg({ ...seg("Z", "A", "B", 1), reactance_ohm_per_m: null })],
    ["load negative", withLoad({ node: "A", current_A: -1 })],
    ["load -1e308", withLoad({ node: "A", current_A: -1e308 })],
    ["load unknown node", withLoad({ node: "Q", current_A: 1 })],
    ["load pf above 1", withLoad({ node: "A", current_A: 1, pf: 1.2 })],
    ["load pf empty string", withLoad({ node: "A", current_A: 1, pf: "" })],
    ["load leading not boolean", withLoad({ node: "A", current_A: 1, leading: "yes" })],
    ["loads null", { ...base, loads: null }],
    ["supply on unknown node", { ...base, supplies: [{ node: "Q", voltage_V: 400 }] }],
    ["two supplies on one node", { ...base, supplies: [{ node: "S", voltage_V: 400 }, { node: "S", voltage_V: 400 }] }],
    ["duplicate conductor id", { ...base, conductors: [CU, CU] }],
    ["mode missing", { ...base, mode: undefined }],
    ["not an object", [base]],
  ];
  it.each(BAD)("rejected by both with the same field and message: %s", (_label, raw) => {
    expect(readNetworkTables(raw)).toBeNull();
    expect(networkInputSchema.safeParse(raw).success).toBe(false);
    expectSameVerdict(raw);
  });

  it("valid variants read the same: numeric strings, padded ids, defaults, reactance override", () => {
    expectSameVerdict(base);
    expectSameVerdict({ ...base, nodes: base.nodes.map((n) => ({ id: ` ${n.id}\t` })) });
    expectSameVerdict(withSeg({ ...seg("Z", "A", "B", 1), length_m: " 1 2.5 ", reactance_ohm_per_m: "2e-5" }));
    expectSameVerdict(withLoad({ node: "A", current_A: "+.5", pf: "0.9", leading: true }));
    expectSameVerdict({ ...base, loads: undefined });
  });

  it("fuzz: any field of the bulk arrays set to a bad or borderline value (fast-check)", () => {
    const valueArb = fc.constantFrom<unknown>("NaN", "abc", -1e308, 1e308, "Infinity", Infinity, Number.NaN, null, true, {}, [], "", " ", "A", "B", "cu", "1e2", " 7 ", "0x1", 0, -0, 1, 0.5, 1e4, 10_000.5, 0.01, "x".repeat(101), undefined);
    const pathArb = fc.oneof(
      fc.tuple(fc.constant("nodes"), fc.integer({ min: 0, max: 5 }), fc.constant("id")),
      fc.tuple(fc.constant("segments"), fc.integer({ min: 0, max: 5 }), fc.constantFrom("id", "from", "to", "conductor", "length_m", "reactance_ohm_per_m")),
      fc.tuple(fc.constant("loads"), fc.integer({ min: 0, max: 1 }), fc.constantFrom("node", "current_A", "pf", "leading")),
    );
    fc.assert(
      fc.property(pathArb, valueArb, ([list, i, key], value) => {
        const raw = structuredClone(ladder("ac")) as unknown as Record<string, Record<string, unknown>[]>;
        raw[list]![i]![key] = value;
        expectSameVerdict(raw);
      }),
      { numRuns: 300, seed: 4242 },
    );
  });
});
