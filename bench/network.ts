/**
 * Bus-network benchmark: generated panels of about 1 000, 10 000 and 100 000 nodes,
 * solved DC and AC, with wall time and memory; and at about 2 000 nodes the sparse
 * solver against mathjs dense lusolve on the same reduced conductance system.
 *
 * Timing: after a JIT warm-up, every size is solved several times; the first, best and
 * median wall times are printed (a long-running server sees the warmed-up figures).
 * Wall time on a shared machine is noisy: run it two or three times.
 *
 * Memory: `process.resourceUsage().maxRSS` is the process's peak resident set so far
 * (it only grows, so sizes run smallest first and each figure is the peak up to and
 * including that run); `heapUsed` after the runs, with the last result still
 * referenced, is what the result and the engine's live data hold.
 */
import { lusolve } from "mathjs";
import { networkInputSchema, readNetworkTables, solveNetwork, type NetworkInput } from "../lib/engine/network";
import { csrToDense, solveSpd, TripletBuilder } from "../lib/engine/sparse";
import { dcResistancePerMetre } from "../lib/engine/resistance";

/**
 * A panel: a main horizontal bus (nodes every 0.2 m) fed at both ends; at every bus
 * node a vertical dropper of 8 nodes (0.15 m apart); from every dropper node a tap-off
 * cable (1–3 m) to a loaded outgoing terminal; every 10th dropper tied at its foot to
 * the next one (meshing). 17 nodes per bus node; an incomer every 60 bus nodes.
 */
export function panelNetwork(targetNodes: number, mode: "dc" | "ac"): NetworkInput {
  const dropperNodes = 8;
  const busNodes = Math.max(2, Math.round(targetNodes / (1 + 2 * dropperNodes)));
  const nodes: { id: string }[] = [];
  const segments: { id: string; from: string; to: string; conductor: string; length_m: number }[] = [];
  const loads: { node: string; current_A: number; pf: number }[] = [];
  let seed = 12345;
  const rnd = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  for (let b = 0; b < busNodes; b++) {
    nodes.push({ id: `B${b}` });
    if (b > 0) segments.push({ id: `MB${b}`, from: `B${b - 1}`, to: `B${b}`, conductor: "main", length_m: 0.2 });
    for (let d = 0; d < dropperNodes; d++) {
      const id = `D${b}_${d}`;
      nodes.push({ id });
      segments.push({ id: `DR${b}_${d}`, from: d === 0 ? `B${b}` : `D${b}_${d - 1}`, to: id, conductor: "dropper", length_m: 0.15 });
      const t = `T${b}_${d}`;
      nodes.push({ id: t });
      segments.push({ id: `TC${b}_${d}`, from: id, to: t, conductor: "tap", length_m: 1 + 2 * rnd() });
      loads.push({ node: t, current_A: 2 + 20 * rnd(), pf: 0.8 + 0.2 * rnd() });
    }
    if (b % 10 === 0 && b + 1 < busNodes)
      segments.push({ id: `TIE${b}`, from: `D${b}_${dropperNodes - 1}`, to: `D${b + 1}_${dropperNodes - 1}`, conductor: "dropper", length_m: 0.2 });
  }
  // an incomer every 60 bus nodes (a section of about 1 000 nodes), at most 100
  const supplies = [];
  for (let b = 0; b < busNodes && supplies.length < 100; b += 60) supplies.push({ node: `B${b}`, voltage_V: 230 });
  return {
    mode,
    ambient_C: 35,
    conductors: [
      {
        id: "main",
        materialId: "cu-etp",
        arrangement: { barWidth_m: 0.1, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.1, orientation: "edge" },
        conductorTemperature_C: 70,
        reactance_ohm_per_m: 1.5e-4,
        acResistanceFactor: 1.1,
        count: 4,
      },
      { id: "dropper", materialId: "cu-etp", area_m2: 6e-4, conductorTemperature_C: 70, reactance_ohm_per_m: 2e-4, ampacity_A: 1200 },
      { id: "tap", materialId: "cu-annealed", area_m2: 16e-6, conductorTemperature_C: 70, reactance_ohm_per_m: 8e-5, ampacity_A: 80 },
    ],
    nodes,
    segments,
    supplies,
    loads,
  };
}

const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(1);

function timeIt<T>(f: () => T): [T, number] {
  const t0 = performance.now();
  const r = f();
  return [r, performance.now() - t0];
}

/** The reduced DC conductance system of a generated panel, built here independently of network.ts. */
function reducedSystem(net: NetworkInput) {
  const idx = new Map(net.nodes.map((n, i) => [n.id, i] as const));
  const fed = new Set(net.supplies.map((s) => idx.get(s.node)!));
  const unk = new Int32Array(net.nodes.length).fill(-1);
  let nu = 0;
  net.nodes.forEach((_, i) => {
    if (!fed.has(i)) unk[i] = nu++;
  });
  const rPerM: Record<string, number> = {
    main: dcResistancePerMetre("cu-etp", 2 * 0.1 * 0.01, 70) / 4,
    dropper: dcResistancePerMetre("cu-etp", 6e-4, 70),
    tap: dcResistancePerMetre("cu-annealed", 16e-6, 70),
  };
  const b = new TripletBuilder(nu);
  for (const s of net.segments) {
    const g = 1 / (rPerM[s.conductor]! * Number(s.length_m));
    const ua = unk[idx.get(s.from)!]!;
    const ub = unk[idx.get(s.to)!]!;
    if (ua >= 0) b.add(ua, ua, g);
    if (ub >= 0) b.add(ub, ub, g);
    if (ua >= 0 && ub >= 0) {
      b.add(ua, ub, -g);
      b.add(ub, ua, -g);
    }
  }
  const rhs = new Float64Array(nu);
  for (const l of net.loads ?? []) rhs[unk[idx.get(l.node)!]!]! -= Number(l.current_A);
  return { A: b.toCsr(), rhs };
}

const median = (xs: number[]) => [...xs].sort((p, q) => p - q)[Math.floor(xs.length / 2)]!;

export async function run(): Promise<void> {
  console.log("bus network — generated panel (main bus, droppers, tap-offs, ties every 10th dropper)");
  console.log("JIT warm-up: three solves of a ~2 000-node panel per mode before timing; then each size is solved RUNS times (total = input reading and validation + solve + results).");
  console.log("zod ms: networkInputSchema.safeParse (the forms/API path); fast read ms: the solver's own validation pass (readNetworkTables).");
  console.log("size | mode | nodes | segments | zod ms | fast read ms | total ms first | best | median | iterations | rel. residual | backward error | max KCL A | peak RSS MB | heapUsed MB");
  for (const mode of ["dc", "ac"] as const) {
    const warm = panelNetwork(2_000, mode);
    for (let i = 0; i < 3; i++) solveNetwork(warm);
  }
  for (const size of [1_000, 10_000, 100_000]) {
    for (const mode of ["dc", "ac"] as const) {
      const runs = size >= 100_000 ? 3 : 5;
      const net = panelNetwork(size, mode);
      const [, tZod] = timeIt(() => networkInputSchema.safeParse(net));
      const [, tFast] = timeIt(() => readNetworkTables(net));
      const times: number[] = [];
      let r!: ReturnType<typeof solveNetwork>;
      for (let k = 0; k < runs; k++) {
        const [res, t] = timeIt(() => solveNetwork(net));
        r = res;
        times.push(t);
      }
      const mem = process.memoryUsage();
      console.log(
        [
          size,
          mode,
          net.nodes.length,
          net.segments.length,
          tZod.toFixed(0),
          tFast.toFixed(0),
          times[0]!.toFixed(0),
          Math.min(...times).toFixed(0),
          median(times).toFixed(0),
          r.results.solver?.iterations,
          r.results.solver?.trueRelativeResidual.toExponential(1),
          r.results.solver?.backwardError.toExponential(1),
          r.results.maxKclResidual_A.toExponential(1),
          mb(process.resourceUsage().maxRSS * 1024),
          mb(mem.heapUsed),
        ].join(" | "),
      );
      if (r.intermediates.thermalTableError) console.log(`   bar temperature table: largest interpolation error ${r.intermediates.thermalTableError.value.toExponential(2)} K`);
    }
  }

  console.log("\nsparse (RCM + IC(0) + PCG) vs mathjs dense lusolve, reduced DC conductance system of a ~2 000-node panel");
  const { A, rhs } = reducedSystem(panelNetwork(2_000, "dc"));
  // sparse: best of five (a few milliseconds each); dense: one run (about a minute)
  let [sp, tSparse] = timeIt(() => solveSpd(A, rhs));
  for (let k = 0; k < 4; k++) {
    const [again, t] = timeIt(() => solveSpd(A, rhs));
    if (t < tSparse) [sp, tSparse] = [again, t];
  }
  const dense = csrToDense(A);
  const [lu, tDense] = timeIt(() => lusolve(dense, Array.from(rhs)) as unknown as number[][]);
  let diff = 0;
  let scale = 0;
  lu.forEach((row, i) => {
    diff = Math.max(diff, Math.abs(row[0]! - sp.x[i]!));
    scale = Math.max(scale, Math.abs(row[0]!));
  });
  console.log(`unknowns ${A.n}: sparse ${tSparse.toFixed(1)} ms (best of 5) (${sp.stats.iterations} iterations), dense lusolve ${tDense.toFixed(0)} ms, ratio ${(tDense / tSparse).toFixed(0)}×, max |Δx|/max|x| ${(diff / scale).toExponential(1)}`);
}

if (process.argv[1] && process.argv[1].endsWith("network.ts")) void run();
