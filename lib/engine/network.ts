/**
 * Bus networks (kind "bus-network"): nodes joined by conductor segments, fed at supply
 * nodes held at a fixed voltage (a phasor for AC) and loaded by constant-current loads.
 *
 * Method — nodal analysis: the weighted Laplacian Y (segment conductances for DC,
 * complex admittances y = 1/(R + jX) for AC) is assembled, the supply nodes are moved
 * to the right-hand side as known potentials, and Y_uu·u = b is solved for the other
 * node potentials (Kirchhoff's current law at every free node). The matrix is sparse
 * symmetric; it is solved by RCM-ordered IC(0)-preconditioned CG (DC) or COCG (AC),
 * see sparse.ts. Unknowns are potentials relative to the first supply, so a drop of a
 * few millivolts is not lost against hundreds of volts.
 *
 * Before solving, unloaded dead ends are peeled off leaf by leaf: a branch with no
 * outlet carries no current, so its nodes take their junction's potential exactly and
 * its segments carry exactly 0 A.
 *
 * Per-phase model: every segment is one conductor (one phase pack, or `count`
 * identical ones in parallel); the return path is not part of the network.
 *
 * Speed: the bulk arrays are read straight into typed columns by a pass with the
 * schema's rules (readNetworkTables), and the per-segment loops are small functions
 * over typed arrays, so a 100 000-node panel allocates little besides its results.
 */
import { z } from "zod";
import { arrangementSchema, barCurrentForTemperature, barTemperatureForCurrent, prepareBusbar, acRatios, type PreparedBusbar } from "./busbar-thermal";
import { check, ENGINE_VERSION, EngineError, q, type CalcResult, type Check, type Formula, type Quantity, type Warning } from "./core/result";
import { choice, fieldErrors, int, num } from "./core/schema";
import { phaseArea, type BarArrangement } from "./geometry";
import { emissivity as finishEmissivity, material, MATERIAL_IDS, resistivityAt, SURFACE_FINISHES } from "./materials";
import { dcResistancePerMetre } from "./resistance";
import { solveComplexSymmetric, solveSpd, TripletBuilder, DEFAULT_TOLERANCE, type SolveStats } from "./sparse";

export const NETWORK_LIMITS = { maxNodes: 200_000, maxSegments: 400_000, maxConductors: 1000, maxSupplies: 100, maxLoads: 200_000 } as const;

const idField = (label: string) => z.string({ error: `${label} must be a text id` }).trim().min(1, `${label} is required`).max(100, `${label} must be at most 100 characters`);

const conductorSchema = z
  .object({
    id: idField("conductor id"),
    materialId: choice("material", MATERIAL_IDS),
    temperId: z.string().optional(),
    /** Cross-section of one conductor, m² (or give a bar arrangement: its phase area is used). */
    // 1e-8 m² = 0.01 mm²: below any real conductor, and far above the sizes at which the
    // conductance matrix loses positive definiteness in double precision.
    area_m2: num("cross-section", "m²", 1e-8, 0.1).optional(),
    arrangement: arrangementSchema.optional(),
    /** Identical conductors (or phase packs) in parallel in every segment of this spec. */
    count: int("conductors in parallel", 1, 100).default(1),
    /** Temperature at which the resistance is taken, °C. */
    conductorTemperature_C: num("conductor temperature", "°C", -40, 250).default(20),
    reactance_ohm_per_m: num("reactance per metre", "Ω/m", 0, 0.01).optional(),
    acResistanceFactor: num("AC resistance factor Rac/Rdc", "", 1, 5).optional(),
    ampacity_A: num("ampacity per conductor", "A", 0, 100_000, { exclusiveMin: true }).optional(),
    maxTemperature_C: num("maximum conductor temperature", "°C", 0, 250).optional(),
    finish: choice("surface finish", SURFACE_FINISHES).default("oxidised"),
  })
  .superRefine((c, ctx) => {
    if (c.area_m2 === undefined && c.arrangement === undefined)
      ctx.addIssue({ code: "custom", path: ["area_m2"], message: "give a cross-section or a bar arrangement" });
    if (c.temperId !== undefined && !material(c.materialId).tempers.some((t) => t.id === c.temperId))
      ctx.addIssue({ code: "custom", path: ["temperId"], message: `temper must be one of: ${material(c.materialId).tempers.map((t) => t.id).join(", ")}` });
  });

const nodeSchema = z.object({ id: idField("node id") });

const segmentSchema = z.object({
  id: idField("segment id"),
  from: idField("from node"),
  to: idField("to node"),
  conductor: idField("conductor"),
  // 0.1 mm: shorter links are joints, not segments (and make the matrix singular in double precision).
  length_m: num("length", "m", 1e-4, 10_000),
  /** Overrides the conductor's reactance per metre for this segment. */
  reactance_ohm_per_m: num("reactance per metre", "Ω/m", 0, 0.01).optional(),
});

const supplySchema = z.object({
  node: idField("supply node"),
  voltage_V: num("supply voltage", "V", 0, 100_000, { exclusiveMin: true }),
  angle_deg: num("supply voltage angle", "°", -180, 180).default(0),
});

const loadSchema = z.object({
  node: idField("load node"),
  current_A: num("load current", "A", 0, 1_000_000),
  pf: num("power factor", "", 0, 1).default(1),
  leading: z.boolean().default(false),
});

const headShape = {
  mode: choice("mode", ["dc", "ac"] as const),
  frequency_Hz: num("frequency", "Hz", 1, 1000).default(50),
  ambient_C: num("ambient temperature", "°C", -40, 80).default(35),
  maxTemperature_C: num("maximum conductor temperature", "°C", 0, 250).default(90),
  dropLimit_pct: num("voltage drop limit", "%", 0, 100, { exclusiveMin: true }).optional(),
  conductors: z.array(conductorSchema).min(1, "conductors: at least one conductor spec is needed").max(NETWORK_LIMITS.maxConductors, `conductors: at most ${NETWORK_LIMITS.maxConductors} specs`),
};
const suppliesSchema = z.array(supplySchema).max(NETWORK_LIMITS.maxSupplies, `supplies: at most ${NETWORK_LIMITS.maxSupplies} supplies`);

export const networkInputSchema = z
  .object({
    ...headShape,
    nodes: z.array(nodeSchema).min(1, "nodes: at least one node is needed").max(NETWORK_LIMITS.maxNodes, `nodes: at most ${NETWORK_LIMITS.maxNodes} nodes`),
    segments: z.array(segmentSchema).max(NETWORK_LIMITS.maxSegments, `segments: at most ${NETWORK_LIMITS.maxSegments} segments`),
    supplies: suppliesSchema,
    loads: z.array(loadSchema).max(NETWORK_LIMITS.maxLoads, `loads: at most ${NETWORK_LIMITS.maxLoads} loads`).default([]),
  })
  .superRefine((v, ctx) => {
    const nodes = new Set<string>();
    v.nodes.forEach((n, i) => {
      if (nodes.has(n.id)) ctx.addIssue({ code: "custom", path: ["nodes", i, "id"], message: `node id "${n.id}" is used twice` });
      nodes.add(n.id);
    });
    const specs = new Set<string>();
    v.conductors.forEach((c, i) => {
      if (specs.has(c.id)) ctx.addIssue({ code: "custom", path: ["conductors", i, "id"], message: `conductor id "${c.id}" is used twice` });
      specs.add(c.id);
    });
    const segs = new Set<string>();
    v.segments.forEach((s, i) => {
      if (segs.has(s.id)) ctx.addIssue({ code: "custom", path: ["segments", i, "id"], message: `segment id "${s.id}" is used twice` });
      segs.add(s.id);
      if (!nodes.has(s.from)) ctx.addIssue({ code: "custom", path: ["segments", i, "from"], message: `from node "${s.from}" is not in the node list` });
      if (!nodes.has(s.to)) ctx.addIssue({ code: "custom", path: ["segments", i, "to"], message: `to node "${s.to}" is not in the node list` });
      if (s.from === s.to) ctx.addIssue({ code: "custom", path: ["segments", i, "to"], message: `segment "${s.id}" must join two different nodes` });
      if (!specs.has(s.conductor)) ctx.addIssue({ code: "custom", path: ["segments", i, "conductor"], message: `conductor "${s.conductor}" is not in the conductor list` });
    });
    const fed = new Set<string>();
    v.supplies.forEach((s, i) => {
      if (!nodes.has(s.node)) ctx.addIssue({ code: "custom", path: ["supplies", i, "node"], message: `supply node "${s.node}" is not in the node list` });
      if (fed.has(s.node)) ctx.addIssue({ code: "custom", path: ["supplies", i, "node"], message: `node "${s.node}" has two supplies` });
      fed.add(s.node);
    });
    v.loads.forEach((l, i) => {
      if (!nodes.has(l.node)) ctx.addIssue({ code: "custom", path: ["loads", i, "node"], message: `load node "${l.node}" is not in the node list` });
    });
  });

/** The small parts of the input (settings, conductor specs, supplies), validated by zod on the fast path too. */
const headSchema = z.object({ ...headShape, supplies: suppliesSchema });

export type NetworkInput = z.input<typeof networkInputSchema>;

/** A disconnected part of the network that has loads but no path to any supply. */
export class IslandError extends EngineError {
  constructor(public readonly islands: string[][]) {
    const first = islands[0]!;
    const shown = first.slice(0, 20).join(", ") + (first.length > 20 ? `, … (${first.length} nodes)` : "");
    super("island", `${islands.length === 1 ? "A part" : `${islands.length} parts`} of the network with loads has no path to a supply: ${shown}`, "segments");
  }
}

export interface NodeResult {
  id: string;
  /** Voltage magnitude (DC: the signed voltage), V; null for an isolated node. */
  voltage_V: number | null;
  angle_deg: number | null;
  /** |V_ref| − |V| with V_ref the first supply, V. */
  drop_V: number | null;
  drop_pct: number | null;
}

export interface SegmentResult {
  id: string;
  from: string;
  to: string;
  /** Current magnitude, A (DC: |I|). */
  current_A: number;
  /** Phase angle of the current from → to, degrees (DC: 0 or 180). */
  angle_deg: number;
  /** +1 when active power (DC: current) flows from → to, −1 when to → from, 0 for none. */
  direction: 1 | -1 | 0;
  resistance_ohm: number;
  reactance_ohm: number;
  loss_W: number;
  /** |I|/(n·A), A/mm² (the trade's unit). */
  currentDensity_A_per_mm2: number;
  temperature_C?: number;
  temperatureRise_K?: number;
  /** I/I_z per conductor when an ampacity is known. */
  utilisation?: number;
}

export interface SupplyResult {
  node: string;
  current_A: number;
  angle_deg: number;
  activePower_W: number;
  reactivePower_var: number;
}

export interface NetworkResults {
  mode: "dc" | "ac";
  nodes: NodeResult[];
  segments: SegmentResult[];
  supplies: SupplyResult[];
  totalLoss_W: number;
  loadPower_W: number;
  supplyPower_W: number;
  maxDrop: { node: string; drop_V: number; drop_pct: number } | null;
  /** Ten hottest segments (by temperature; by current density when no temperature is known). */
  hottest: { id: string; temperature_C?: number; currentDensity_A_per_mm2: number }[];
  hottestBasis: "temperature" | "current-density";
  /** Largest |Σ I_in − I_load| over the free nodes, A: Kirchhoff's current law check of the solution. */
  maxKclResidual_A: number;
  solver: (SolveStats & { unknowns: number }) | null;
  /** Dead-end nodes peeled off before the solve (they carry no current). */
  deadEndNodes: number;
  isolatedNodes: string[];
  /**
   * Present only on a stored result of a large network (see `compactNetworkResult`): every
   * segment's and node's values as columns, while `segments` keeps only the hottest, the
   * overloaded and the first dead-end segments in full and `nodes` is empty.
   */
  columns?: NetworkResultColumns;
}

/** Per-segment and per-node values of a large network as columns, 6 significant figures. */
export interface NetworkResultColumns {
  segments: { id: string[]; current_A: number[]; loss_W: number[]; temperatureRise_K: (number | null)[]; utilisation: (number | null)[] };
  nodes: { id: string[]; voltage_V: (number | null)[]; drop_pct: (number | null)[] };
  /** Segments carrying no current (unloaded dead ends). */
  deadSegmentCount: number;
}

/** Above this many segments a stored result keeps its per-segment values as columns. */
export const NETWORK_FULL_RESULT_LIMIT = 1500;
/** Segments of each kind (overloaded, dead end) kept in full in a compact result. */
const COMPACT_KEPT = 40;

const sig6 = (x: number) => Number(x.toPrecision(6));
const sig6OrNull = (x: number | null | undefined) => (x === null || x === undefined || !Number.isFinite(x) ? null : sig6(x));

/**
 * The result as stored for a large network: the same headline values, checks, formulas
 * and warnings; the per-segment and per-node values as columns rounded to six
 * significant figures (about a seventh of the size of the object form: for 10⁵
 * segments, ~7 MB instead of ~50 MB), and the hottest, the first overloaded and the
 * first dead-end segments in full. Smaller networks are returned unchanged.
 */
export function compactNetworkResult(result: CalcResult<NetworkResults>, limit = NETWORK_FULL_RESULT_LIMIT): CalcResult<NetworkResults> {
  const r = result.results;
  if (r.columns || r.segments.length <= limit) return result;
  const hot = new Set(r.hottest.map((h) => h.id));
  const kept: SegmentResult[] = [];
  let over = 0;
  let dead = 0;
  const n = r.segments.length;
  const seg = { id: new Array<string>(n), current_A: new Array<number>(n), loss_W: new Array<number>(n), temperatureRise_K: new Array<number | null>(n), utilisation: new Array<number | null>(n) };
  for (let i = 0; i < n; i++) {
    const s = r.segments[i]!;
    seg.id[i] = s.id;
    seg.current_A[i] = sig6(s.current_A);
    seg.loss_W[i] = sig6(s.loss_W);
    seg.temperatureRise_K[i] = sig6OrNull(s.temperatureRise_K);
    seg.utilisation[i] = sig6OrNull(s.utilisation);
    const isDead = s.current_A === 0 && s.direction === 0;
    if (isDead) dead++;
    if (hot.has(s.id)) kept.push(s);
    else if (isDead && dead <= COMPACT_KEPT) kept.push(s);
    else if ((s.utilisation ?? 0) > 1 && over++ < COMPACT_KEPT) kept.push(s);
  }
  const m = r.nodes.length;
  const nodes = { id: new Array<string>(m), voltage_V: new Array<number | null>(m), drop_pct: new Array<number | null>(m) };
  for (let i = 0; i < m; i++) {
    const v = r.nodes[i]!;
    nodes.id[i] = v.id;
    nodes.voltage_V[i] = sig6OrNull(v.voltage_V);
    nodes.drop_pct[i] = sig6OrNull(v.drop_pct);
  }
  return { ...result, results: { ...r, nodes: [], segments: kept, columns: { segments: seg, nodes, deadSegmentCount: dead } } };
}

// ---------------------------------------------------------------------------------

interface SpecData {
  rPerM: number;
  xPerM: number;
  area: number;
  count: number;
  ampacity?: number;
  tmax: number;
  thermal?: ThermalTable;
  acRatio: number;
}

/**
 * Steady temperature against current for one bar arrangement, tabulated from the
 * explicit inverse I(θ) of the heat balance on a uniform θ grid and read by linear
 * interpolation in I². The error is measured at every interval's mid-temperature
 * (exact pair I(θ_mid), θ_mid) and reported.
 */
interface ThermalTable {
  prepared: PreparedBusbar;
  i2: Float64Array;
  theta: Float64Array;
  maxError_K: number;
}

const TABLE_POINTS = 96;

function buildThermalTable(p: PreparedBusbar, maxCurrent: number): ThermalTable {
  const ta = p.ambient_C;
  let top = ta + 20;
  while (barCurrentForTemperature(p, top) < maxCurrent && top < 1000) top = ta + (top - ta) * 2;
  const theta = new Float64Array(TABLE_POINTS);
  const i2 = new Float64Array(TABLE_POINTS);
  for (let k = 0; k < TABLE_POINTS; k++) {
    theta[k] = ta + ((top - ta) * k) / (TABLE_POINTS - 1);
    const I = barCurrentForTemperature(p, theta[k]!);
    i2[k] = I * I;
  }
  const t: ThermalTable = { prepared: p, i2, theta, maxError_K: 0 };
  for (let k = 0; k + 1 < TABLE_POINTS; k++) {
    const thMid = (theta[k]! + theta[k + 1]!) / 2;
    const I = barCurrentForTemperature(p, thMid);
    t.maxError_K = Math.max(t.maxError_K, Math.abs(lookup(t, I) - thMid));
  }
  return t;
}

function lookup(t: ThermalTable, I: number): number {
  const x = I * I;
  const n = t.i2.length;
  if (x >= t.i2[n - 1]!) {
    try {
      return barTemperatureForCurrent(t.prepared, I);
    } catch (e) {
      if (e instanceof EngineError && e.code === "thermal-runaway") return Number.NaN;
      throw e;
    }
  }
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t.i2[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const f = (x - t.i2[lo]!) / (t.i2[hi]! - t.i2[lo]!);
  return t.theta[lo]! + f * (t.theta[hi]! - t.theta[lo]!);
}

// ---------------------------------------------------------------------------------
// Input reading. `networkInputSchema` is the contract (forms, API, messages). A panel
// of 100 000 nodes has some 300 000 bulk records, and zod spends more time on them
// than the solve; so the bulk arrays (nodes, segments, loads) are checked here by a
// hand-written pass with exactly the schema's rules, straight into typed columns.
// Whenever that pass finds anything wrong, the zod schema parses the input instead
// and its messages are reported: the messages are the schema's by construction.

/** The input as the solver reads it: settings and specs from zod, bulk arrays as columns. */
export interface NetworkTables {
  head: z.output<typeof headSchema>;
  nodeIds: string[];
  nodeIndex: Map<string, number>;
  segmentIds: string[];
  segmentFrom: string[];
  segmentTo: string[];
  sFrom: Int32Array;
  sTo: Int32Array;
  sSpec: Int32Array;
  sLength: Float64Array;
  /** Per-segment reactance override, Ω/m; NaN where the conductor's value applies. */
  sReactance: Float64Array;
  loadNode: Int32Array;
  loadCurrent: Float64Array;
  loadPf: Float64Array;
  loadLeading: Uint8Array;
}

/** The numeric strings `num` (core/schema.ts) accepts. */
const NUMERIC = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** The number `num(label, unit, min, max)` yields for v, or NaN where it reports an issue. */
function numberIn(v: unknown, min: number, max: number, exclusiveMin: boolean): number {
  let x: number;
  if (typeof v === "number") x = v;
  else if (typeof v === "string") {
    const t = v.trim().replace(/\s+/g, "");
    x = t !== "" && NUMERIC.test(t) ? Number(t) : Number.NaN;
  } else return Number.NaN;
  return Number.isFinite(x) && (exclusiveMin ? x > min : x >= min) && x <= max ? x : Number.NaN;
}

/** The id `idField` yields (trimmed, 1–100 characters), or null. */
function idIn(v: unknown): string | null {
  if (typeof v !== "string") return null;
  const len = v.length;
  // an id that starts and ends with a printable ASCII character has nothing to trim
  const first = len > 0 ? v.charCodeAt(0) : 0;
  const last = len > 0 ? v.charCodeAt(len - 1) : 0;
  if (first > 32 && first < 127 && last > 32 && last < 127) return len <= 100 ? v : null;
  const t = v.trim();
  return t.length >= 1 && t.length <= 100 ? t : null;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/**
 * The hand-written pass: the input as tables when it is valid in every respect the
 * schema checks, null otherwise (then the schema reports what is wrong).
 */
export function readNetworkTables(raw: unknown): NetworkTables | null {
  if (!isRecord(raw)) return null;
  const headParsed = headSchema.safeParse({
    mode: raw.mode,
    frequency_Hz: raw.frequency_Hz,
    ambient_C: raw.ambient_C,
    maxTemperature_C: raw.maxTemperature_C,
    dropLimit_pct: raw.dropLimit_pct,
    conductors: raw.conductors,
    supplies: raw.supplies,
  });
  if (!headParsed.success) return null;
  const head = headParsed.data;
  const specIndex = new Map<string, number>();
  for (let k = 0; k < head.conductors.length; k++) {
    const id = head.conductors[k]!.id;
    if (specIndex.has(id)) return null;
    specIndex.set(id, k);
  }

  const rawNodes = raw.nodes;
  if (!Array.isArray(rawNodes) || rawNodes.length < 1 || rawNodes.length > NETWORK_LIMITS.maxNodes) return null;
  const n = rawNodes.length;
  const nodeIds: string[] = []; // filled by push: `new Array(n)` of 100 000+ is a slow dictionary array in V8
  const nodeIndex = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const nd: unknown = rawNodes[i];
    if (!isRecord(nd)) return null;
    const id = idIn(nd.id);
    if (id === null || nodeIndex.has(id)) return null;
    nodeIds.push(id);
    nodeIndex.set(id, i);
  }

  const rawSegs = raw.segments;
  if (!Array.isArray(rawSegs) || rawSegs.length > NETWORK_LIMITS.maxSegments) return null;
  const m = rawSegs.length;
  const segmentIds: string[] = [];
  const segmentFrom: string[] = [];
  const segmentTo: string[] = [];
  const sFrom = new Int32Array(m);
  const sTo = new Int32Array(m);
  const sSpec = new Int32Array(m);
  const sLength = new Float64Array(m);
  const sReactance = new Float64Array(m);
  const segSeen = new Set<string>();
  for (let k = 0; k < m; k++) {
    const sg: unknown = rawSegs[k];
    if (!isRecord(sg)) return null;
    const id = idIn(sg.id);
    const from = idIn(sg.from);
    const to = idIn(sg.to);
    const cond = idIn(sg.conductor);
    if (id === null || from === null || to === null || cond === null || from === to || segSeen.has(id)) return null;
    const a = nodeIndex.get(from);
    const b = nodeIndex.get(to);
    const spec = specIndex.get(cond);
    if (a === undefined || b === undefined || spec === undefined) return null;
    const len = numberIn(sg.length_m, 1e-4, 10_000, false);
    if (Number.isNaN(len)) return null;
    let x = Number.NaN;
    if (sg.reactance_ohm_per_m !== undefined) {
      x = numberIn(sg.reactance_ohm_per_m, 0, 0.01, false);
      if (Number.isNaN(x)) return null;
    }
    segSeen.add(id);
    segmentIds.push(id);
    segmentFrom.push(from);
    segmentTo.push(to);
    sFrom[k] = a;
    sTo[k] = b;
    sSpec[k] = spec;
    sLength[k] = len;
    sReactance[k] = x;
  }

  const fed = new Set<string>();
  for (const s of head.supplies) {
    if (!nodeIndex.has(s.node) || fed.has(s.node)) return null;
    fed.add(s.node);
  }

  const rawLoads = raw.loads === undefined ? [] : raw.loads;
  if (!Array.isArray(rawLoads) || rawLoads.length > NETWORK_LIMITS.maxLoads) return null;
  const nl = rawLoads.length;
  const loadNode = new Int32Array(nl);
  const loadCurrent = new Float64Array(nl);
  const loadPf = new Float64Array(nl);
  const loadLeading = new Uint8Array(nl);
  for (let j = 0; j < nl; j++) {
    const l: unknown = rawLoads[j];
    if (!isRecord(l)) return null;
    const node = idIn(l.node);
    const i = node === null ? undefined : nodeIndex.get(node);
    if (i === undefined) return null;
    const current = numberIn(l.current_A, 0, 1_000_000, false);
    const pf = l.pf === undefined ? 1 : numberIn(l.pf, 0, 1, false);
    if (Number.isNaN(current) || Number.isNaN(pf)) return null;
    if (l.leading !== undefined && typeof l.leading !== "boolean") return null;
    loadNode[j] = i;
    loadCurrent[j] = current;
    loadPf[j] = pf;
    loadLeading[j] = l.leading === true ? 1 : 0;
  }
  return { head, nodeIds, nodeIndex, segmentIds, segmentFrom, segmentTo, sFrom, sTo, sSpec, sLength, sReactance, loadNode, loadCurrent, loadPf, loadLeading };
}

/**
 * All field messages for a network input (as `fieldErrors` of the schema gives them),
 * or null when it is valid — the fast pass decides, zod words the messages. For
 * callers that would otherwise run the whole schema over the bulk arrays.
 */
export function networkInputErrors(raw: unknown): Record<string, string> | null {
  if (readNetworkTables(raw)) return null;
  const parsed = networkInputSchema.safeParse(raw);
  return parsed.success ? null : fieldErrors(parsed.error);
}

/** Tables from the fast pass; when it finds a problem, the schema's first field message as an EngineError. */
function readInput(raw: unknown): NetworkTables {
  const fast = readNetworkTables(raw);
  if (fast) return fast;
  const parsed = networkInputSchema.safeParse(raw);
  if (!parsed.success) {
    const [field, message] = Object.entries(fieldErrors(parsed.error))[0] ?? ["_", "invalid input"];
    throw new EngineError("invalid-input", `${field}: ${message}`, field);
  }
  // The schema's output is plain data the fast pass always reads; null would be a defect here.
  const again = readNetworkTables(parsed.data);
  if (!again) throw new EngineError("invalid-input", "the network input could not be read", "_");
  return again;
}

// The hot loops over all segments, as small functions of typed arrays: V8 optimises
// them early and they allocate nothing per segment.

interface SegmentColumns {
  sFrom: Int32Array;
  sTo: Int32Array;
  sR: Float64Array;
  sX: Float64Array;
  /** 1 for a segment that carries current (not peeled, reached from a supply). */
  live: Uint8Array;
  /** Node potentials relative to the first supply, real and imaginary parts. */
  uR: Float64Array;
  uI: Float64Array;
}

/** Y_uu entries into `builder`, and the supply terms −Y_us·V_s into b (nodal analysis). */
function assembleNodal(c: SegmentColumns & { unk: Int32Array; supplyOf: Int32Array }, builder: TripletBuilder, bR: Float64Array, bI: Float64Array): void {
  const { sFrom, sTo, sR, sX, live, unk, supplyOf, uR, uI } = c;
  for (let k = 0; k < sFrom.length; k++) {
    if (!live[k]) continue;
    const d = sR[k]! * sR[k]! + sX[k]! * sX[k]!;
    const yr = sR[k]! / d;
    const yi = -sX[k]! / d;
    const a = sFrom[k]!;
    const b = sTo[k]!;
    const ua = unk[a]!;
    const ub = unk[b]!;
    if (ua >= 0) builder.add(ua, ua, yr, yi);
    if (ub >= 0) builder.add(ub, ub, yr, yi);
    if (ua >= 0 && ub >= 0) {
      builder.add(ua, ub, -yr, -yi);
      builder.add(ub, ua, -yr, -yi);
    } else if (ua >= 0 && supplyOf[b]! >= 0) {
      bR[ua] = bR[ua]! + yr * uR[b]! - yi * uI[b]!;
      bI[ua] = bI[ua]! + yr * uI[b]! + yi * uR[b]!;
    } else if (ub >= 0 && supplyOf[a]! >= 0) {
      bR[ub] = bR[ub]! + yr * uR[a]! - yi * uI[a]!;
      bI[ub] = bI[ub]! + yr * uI[a]! + yi * uR[a]!;
    }
  }
}

/** Segment current phasors I = ΔV/(R + jX), the net inflow at every node, and Σ|I|²R. */
function segmentCurrents(c: SegmentColumns, n: number) {
  const { sFrom, sTo, sR, sX, live, uR, uI } = c;
  const m = sFrom.length;
  const iR = new Float64Array(m);
  const iI = new Float64Array(m);
  const inflowR = new Float64Array(n);
  const inflowI = new Float64Array(n);
  let totalLoss = 0;
  for (let k = 0; k < m; k++) {
    if (!live[k]) continue;
    const a = sFrom[k]!;
    const b = sTo[k]!;
    const dr = uR[a]! - uR[b]!;
    const di = uI[a]! - uI[b]!;
    const r = sR[k]!;
    const x = sX[k]!;
    const d = r * r + x * x;
    // I = ΔV/(R + jX) = ΔV·(R − jX)/(R² + X²)
    const cr = (dr * r + di * x) / d;
    const ci = (di * r - dr * x) / d;
    iR[k] = cr;
    iI[k] = ci;
    inflowR[b] = inflowR[b]! + cr;
    inflowI[b] = inflowI[b]! + ci;
    inflowR[a] = inflowR[a]! - cr;
    inflowI[a] = inflowI[a]! - ci;
    totalLoss += (cr * cr + ci * ci) * r;
  }
  return { iR, iI, inflowR, inflowI, totalLoss };
}

/** Node voltages (magnitude and angle), drops against |V_ref|, the largest drop and Σ Re(V·conj(I_load)). */
function nodeResults(
  nodeIds: string[],
  reached: Uint8Array,
  uR: Float64Array,
  uI: Float64Array,
  loadR: Float64Array,
  loadI: Float64Array,
  vRefR: number,
  vRefI: number,
  vRefMag: number,
  ac: boolean,
): { nodes: NodeResult[]; worst: number; loadPower: number } {
  const nodes: NodeResult[] = []; // filled by push: `new Array(n)` of 100 000+ is a slow dictionary array in V8
  let worst = -1;
  let worstDrop = -Infinity;
  let loadPower = 0;
  for (let i = 0; i < nodeIds.length; i++) {
    const id = nodeIds[i]!;
    if (!reached[i]) {
      nodes.push({ id, voltage_V: null, angle_deg: null, drop_V: null, drop_pct: null });
      continue;
    }
    const vr = uR[i]! + vRefR;
    const vi = uI[i]! + vRefI;
    const mag = ac ? Math.sqrt(vr * vr + vi * vi) : vr;
    const drop = vRefMag - mag;
    nodes.push({ id, voltage_V: mag, angle_deg: ac ? (Math.atan2(vi, vr) * 180) / Math.PI : 0, drop_V: drop, drop_pct: (drop / vRefMag) * 100 });
    if (worst < 0 || drop > worstDrop) {
      worst = i;
      worstDrop = drop;
    }
    // P = Re(V·conj(I))
    loadPower += vr * loadR[i]! + vi * loadI[i]!;
  }
  return { nodes, worst, loadPower };
}

/** Per-segment results: current phasor, direction of power flow, loss, current density, temperature, utilisation. */
function segmentResults(tables: NetworkTables, specs: SpecData[], c: SegmentColumns, iR: Float64Array, iI: Float64Array, vRefR: number, vRefI: number, ambient: number, ac: boolean) {
  const segments: SegmentResult[] = [];
  let anyTemp = false;
  let overloads = 0;
  let maxUtil = 0;
  let hotTemp = 0;
  const runaway: string[] = [];
  const hotPerSpec = new Float64Array(specs.length).fill(-Infinity);
  const { sSpec } = tables;
  for (let k = 0; k < sSpec.length; k++) {
    const sp = specs[sSpec[k]!]!;
    const cr = iR[k]!;
    const ci = iI[k]!;
    const mag = ac ? Math.sqrt(cr * cr + ci * ci) : Math.abs(cr);
    const a = c.sFrom[k]!;
    const pFlow = (c.uR[a]! + vRefR) * cr + (c.uI[a]! + vRefI) * ci;
    const seg: SegmentResult = {
      id: tables.segmentIds[k]!,
      from: tables.segmentFrom[k]!,
      to: tables.segmentTo[k]!,
      current_A: mag,
      angle_deg: mag === 0 ? 0 : (Math.atan2(ci, cr) * 180) / Math.PI,
      direction: mag === 0 ? 0 : pFlow >= 0 ? 1 : -1,
      resistance_ohm: c.sR[k]!,
      reactance_ohm: c.sX[k]!,
      loss_W: mag * mag * c.sR[k]!,
      currentDensity_A_per_mm2: mag / (sp.area * 1e6),
    };
    const perCond = mag / sp.count;
    if (sp.thermal) {
      const th = lookup(sp.thermal, perCond);
      if (Number.isNaN(th)) runaway.push(seg.id);
      else seg.temperature_C = th;
    } else if (sp.ampacity !== undefined) {
      const u = perCond / sp.ampacity;
      seg.temperature_C = ambient + (sp.tmax - ambient) * u * u;
    }
    if (sp.ampacity !== undefined) {
      seg.utilisation = perCond / sp.ampacity;
      if (seg.utilisation > 1) overloads++;
      if (seg.utilisation > maxUtil) maxUtil = seg.utilisation;
    }
    if (seg.temperature_C !== undefined) {
      anyTemp = true;
      seg.temperatureRise_K = seg.temperature_C - ambient;
      if (seg.temperature_C > hotTemp) hotTemp = seg.temperature_C;
      if (seg.temperature_C > hotPerSpec[sSpec[k]!]!) hotPerSpec[sSpec[k]!] = seg.temperature_C;
    }
    segments.push(seg);
  }
  return { segments, anyTemp, overloads, maxUtil, hotTemp, runaway, hotPerSpec };
}

/** Largest |Σ I_in − I_load| over the free nodes (Kirchhoff's current law residual). */
function kclResidual(reached: Uint8Array, supplyOf: Int32Array, inflowR: Float64Array, inflowI: Float64Array, loadR: Float64Array, loadI: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < reached.length; i++) {
    if (!reached[i] || supplyOf[i]! >= 0) continue;
    const er = inflowR[i]! - loadR[i]!;
    const ei = inflowI[i]! - loadI[i]!;
    const e = Math.sqrt(er * er + ei * ei);
    if (e > worst) worst = e;
  }
  return worst;
}

/** Largest current per conductor of every spec, A. */
function largestCurrentPerSpec(sSpec: Int32Array, specCount: Float64Array, iR: Float64Array, iI: Float64Array): Float64Array {
  const out = new Float64Array(specCount.length);
  for (let k = 0; k < sSpec.length; k++) {
    const s = sSpec[k]!;
    const I = Math.sqrt(iR[k]! * iR[k]! + iI[k]! * iI[k]!) / specCount[s]!;
    if (I > out[s]!) out[s] = I;
  }
  return out;
}

/** The ten segments with the highest temperature (or current density when no temperature is known), highest first. */
function hottestTen(segments: SegmentResult[], byTemperature: boolean): SegmentResult[] {
  const score = (s: SegmentResult) => (byTemperature ? (s.temperature_C ?? -Infinity) : s.currentDensity_A_per_mm2);
  const top: SegmentResult[] = [];
  for (let k = 0; k < segments.length; k++) {
    const s = segments[k]!;
    const v = score(s);
    if (top.length < 10 || v > score(top[top.length - 1]!)) {
      let pos = top.length;
      while (pos > 0 && score(top[pos - 1]!) < v) pos--;
      top.splice(pos, 0, s);
      if (top.length > 10) top.pop();
    }
  }
  return top;
}

export function solveNetwork(raw: NetworkInput): CalcResult<NetworkResults> {
  const tables = readInput(raw);
  const inp = tables.head;
  const warnings: Warning[] = [];
  const checks: Check[] = [];
  const formulas: Formula[] = [];
  const intermediates: Record<string, Quantity> = {};
  const ac = inp.mode === "ac";
  if (inp.supplies.length === 0) throw new EngineError("no-supply", "The network has no supply node: give at least one supply with its voltage", "supplies");

  // --- conductor specs: resistance and reactance per metre once per spec
  const specs: SpecData[] = inp.conductors.map((c) => {
    const arr = c.arrangement as BarArrangement | undefined;
    const area = arr ? phaseArea(arr) : c.area_m2!;
    let acRatio = 1;
    let xPerM = c.reactance_ohm_per_m ?? 0;
    if (ac) {
      if (c.acResistanceFactor !== undefined) acRatio = c.acResistanceFactor;
      if (arr && (c.acResistanceFactor === undefined || c.reactance_ohm_per_m === undefined)) {
        const rho = resistivityAt(material(c.materialId), c.conductorTemperature_C, c.temperId);
        const r = acRatios(arr, inp.frequency_Hz, rho);
        const worst = r.ratio.indexOf(Math.max(...r.ratio));
        if (c.acResistanceFactor === undefined) acRatio = r.ratio[worst]!;
        if (c.reactance_ohm_per_m === undefined) xPerM = r.reactance_ohm_m[worst]!;
      }
    }
    const rPerM = (dcResistancePerMetre(c.materialId, area, c.conductorTemperature_C, c.temperId) * acRatio) / c.count;
    const spec: SpecData = { rPerM, xPerM: xPerM / c.count, area: area * c.count, count: c.count, tmax: c.maxTemperature_C ?? inp.maxTemperature_C, acRatio };
    if (c.ampacity_A !== undefined) spec.ampacity = c.ampacity_A;
    return spec;
  });
  if (!ac && inp.conductors.some((c) => c.reactance_ohm_per_m || c.acResistanceFactor))
    warnings.push({ code: "reactance-ignored", message: "Reactance and AC resistance factors are ignored in DC mode." });
  if (!ac) for (const s of specs) s.xPerM = 0;

  // --- nodes, segments, loads, supplies
  const { nodeIds, nodeIndex, sFrom, sTo, sSpec, sLength, sReactance, loadNode, loadCurrent, loadPf, loadLeading } = tables;
  const n = nodeIds.length;
  const m = sFrom.length;
  const specR = new Float64Array(specs.length);
  const specX = new Float64Array(specs.length);
  const specCount = new Float64Array(specs.length);
  specs.forEach((sp, k) => {
    specR[k] = sp.rPerM;
    specX[k] = sp.xPerM;
    specCount[k] = sp.count;
  });
  const sR = new Float64Array(m);
  const sX = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const spec = sSpec[k]!;
    const len = sLength[k]!;
    sR[k] = specR[spec]! * len;
    if (ac) {
      const x = sReactance[k]!;
      sX[k] = (Number.isNaN(x) ? specX[spec]! : x / specCount[spec]!) * len;
    }
  }
  const loadR = new Float64Array(n);
  const loadI = new Float64Array(n);
  const refAngle = (inp.supplies[0]!.angle_deg * Math.PI) / 180;
  let anyPf = false;
  for (let j = 0; j < loadNode.length; j++) {
    const i = loadNode[j]!;
    const current = loadCurrent[j]!;
    if (loadPf[j] !== 1) anyPf = true;
    if (ac) {
      // Constant-current load, phasor referred to the first supply's voltage angle (common practice).
      const ang = Math.acos(loadPf[j]!) * (loadLeading[j] ? 1 : -1) + refAngle;
      loadR[i] = loadR[i]! + current * Math.cos(ang);
      loadI[i] = loadI[i]! + current * Math.sin(ang);
    } else loadR[i] = loadR[i]! + current;
  }
  if (!ac && anyPf) warnings.push({ code: "pf-ignored", message: "Load power factors are ignored in DC mode." });
  const supplyOf = new Int32Array(n).fill(-1);
  const vRef = inp.supplies[0]!;
  const vRefR = vRef.voltage_V * Math.cos((vRef.angle_deg * Math.PI) / 180);
  const vRefI = ac ? vRef.voltage_V * Math.sin((vRef.angle_deg * Math.PI) / 180) : 0;
  // potentials relative to the reference supply
  const uR = new Float64Array(n);
  const uI = new Float64Array(n);
  inp.supplies.forEach((s, k) => {
    const i = nodeIndex.get(s.node)!;
    supplyOf[i] = k;
    const a = ac ? (s.angle_deg * Math.PI) / 180 : 0;
    uR[i] = s.voltage_V * Math.cos(a) - vRefR;
    uI[i] = ac ? s.voltage_V * Math.sin(a) - vRefI : 0;
  });
  if (!ac && inp.supplies.some((s) => s.angle_deg !== 0)) warnings.push({ code: "angle-ignored", message: "Supply voltage angles are ignored in DC mode." });

  // --- incidence lists
  const adjPtr = new Int32Array(n + 1);
  for (let k = 0; k < m; k++) {
    adjPtr[sFrom[k]! + 1]!++;
    adjPtr[sTo[k]! + 1]!++;
  }
  for (let i = 0; i < n; i++) adjPtr[i + 1] = adjPtr[i + 1]! + adjPtr[i]!;
  const adjSeg = new Int32Array(2 * m);
  {
    const fill = adjPtr.slice(0, n);
    for (let k = 0; k < m; k++) {
      adjSeg[fill[sFrom[k]!]!++] = k;
      adjSeg[fill[sTo[k]!]!++] = k;
    }
  }
  const other = (k: number, v: number) => (sFrom[k] === v ? sTo[k]! : sFrom[k]!);

  // --- reachability from the supplies
  const reached = new Uint8Array(n);
  const queue = new Int32Array(n);
  let qt = 0;
  for (let i = 0; i < n; i++)
    if (supplyOf[i]! >= 0) {
      reached[i] = 1;
      queue[qt++] = i;
    }
  for (let qh = 0; qh < qt; qh++) {
    const v = queue[qh]!;
    for (let p = adjPtr[v]!; p < adjPtr[v + 1]!; p++) {
      const w = other(adjSeg[p]!, v);
      if (!reached[w]) {
        reached[w] = 1;
        queue[qt++] = w;
      }
    }
  }
  const isolatedNodes: string[] = [];
  if (qt < n) {
    const seen = new Uint8Array(n);
    const islands: string[][] = [];
    for (let s = 0; s < n; s++) {
      if (reached[s] || seen[s]) continue;
      const comp: number[] = [s];
      seen[s] = 1;
      let loaded = false;
      for (let h = 0; h < comp.length; h++) {
        const v = comp[h]!;
        if (loadR[v] !== 0 || loadI[v] !== 0) loaded = true;
        for (let p = adjPtr[v]!; p < adjPtr[v + 1]!; p++) {
          const w = other(adjSeg[p]!, v);
          if (!seen[w]) {
            seen[w] = 1;
            comp.push(w);
          }
        }
      }
      const ids = comp.map((v) => nodeIds[v]!);
      if (loaded) islands.push(ids);
      else isolatedNodes.push(...ids);
    }
    if (islands.length) throw new IslandError(islands);
    warnings.push({
      code: "isolated-nodes",
      message: `${isolatedNodes.length} unloaded node(s) have no path to a supply and are left out: ${isolatedNodes.slice(0, 20).join(", ")}${isolatedNodes.length > 20 ? ", …" : ""}`,
    });
  }

  // --- peel unloaded dead ends (exact zero current)
  const liveDeg = new Int32Array(n);
  for (let i = 0; i < n; i++) liveDeg[i] = adjPtr[i + 1]! - adjPtr[i]!;
  const pruned = new Uint8Array(n);
  const deadSeg = new Uint8Array(m);
  const parent = new Int32Array(n).fill(-1);
  const pruneOrder: number[] = [];
  const peelable = (v: number) => reached[v] === 1 && !pruned[v] && supplyOf[v]! < 0 && liveDeg[v]! <= 1 && loadR[v] === 0 && loadI[v] === 0;
  const stack: number[] = [];
  for (let i = 0; i < n; i++) if (peelable(i)) stack.push(i);
  while (stack.length) {
    const v = stack.pop()!;
    if (!peelable(v)) continue;
    pruned[v] = 1;
    pruneOrder.push(v);
    for (let p = adjPtr[v]!; p < adjPtr[v + 1]!; p++) {
      const k = adjSeg[p]!;
      if (deadSeg[k]) continue;
      deadSeg[k] = 1;
      const w = other(k, v);
      parent[v] = w;
      liveDeg[w]!--;
      if (peelable(w)) stack.push(w);
    }
  }

  // segments that carry current: not peeled, and reached from a supply
  const live = new Uint8Array(m);
  for (let k = 0; k < m; k++) live[k] = !deadSeg[k] && reached[sFrom[k]!] ? 1 : 0;

  // --- assemble Y_uu·u = b over the free nodes
  const unk = new Int32Array(n).fill(-1);
  let nu = 0;
  for (let i = 0; i < n; i++) if (reached[i] && !pruned[i] && supplyOf[i]! < 0) unk[i] = nu++;
  const builder = new TripletBuilder(nu, 4 * m + 4);
  const bR = new Float64Array(nu);
  const bI = new Float64Array(nu);
  for (let i = 0; i < n; i++) {
    const u = unk[i]!;
    if (u >= 0) {
      bR[u] = -loadR[i]!;
      bI[u] = -loadI[i]!;
    }
  }
  assembleNodal({ sFrom, sTo, sR, sX, live, unk, supplyOf, uR, uI }, builder, bR, bI);
  let solver: NetworkResults["solver"] = null;
  if (nu > 0) {
    if (ac) {
      const r = solveComplexSymmetric(builder.toComplexCsr(), bR, bI, { tol: DEFAULT_TOLERANCE });
      solver = { ...r.stats, unknowns: nu };
      for (let i = 0; i < n; i++) {
        const u = unk[i]!;
        if (u >= 0) {
          uR[i] = r.xr[u]!;
          uI[i] = r.xi[u]!;
        }
      }
    } else {
      const r = solveSpd(builder.toCsr(), bR, { tol: DEFAULT_TOLERANCE });
      solver = { ...r.stats, unknowns: nu };
      for (let i = 0; i < n; i++) {
        const u = unk[i]!;
        if (u >= 0) uR[i] = r.x[u]!;
      }
    }
    if (!solver.converged)
      throw new EngineError("solver-no-convergence", `The network solve did not converge (relative residual ${solver.trueRelativeResidual.toExponential(2)}, backward error ${solver.backwardError.toExponential(2)} after ${solver.iterations} iterations)`);
  }
  for (let t = pruneOrder.length - 1; t >= 0; t--) {
    const v = pruneOrder[t]!;
    const w = parent[v]!;
    if (w >= 0) {
      uR[v] = uR[w]!;
      uI[v] = uI[w]!;
    }
  }

  // --- segment currents, losses, KCL check
  const { iR, iI, inflowR, inflowI, totalLoss } = segmentCurrents({ sFrom, sTo, sR, sX, live, uR, uI }, n);
  const maxKcl = kclResidual(reached, supplyOf, inflowR, inflowI, loadR, loadI);

  // --- node voltages and drops
  const { nodes, worst, loadPower } = nodeResults(nodeIds, reached, uR, uI, loadR, loadI, vRefR, vRefI, vRef.voltage_V, ac);
  const worstNode = worst >= 0 ? nodes[worst]! : null;
  const maxDrop: NetworkResults["maxDrop"] = worstNode ? { node: worstNode.id, drop_V: worstNode.drop_V!, drop_pct: worstNode.drop_pct! } : null;
  let supplyPower = 0;
  const supplies: SupplyResult[] = inp.supplies.map((s) => {
    const i = nodeIndex.get(s.node)!;
    // current delivered by the supply = current into the network + its own node's load
    const cr = -inflowR[i]! + loadR[i]!;
    const ci = -inflowI[i]! + loadI[i]!;
    const vr = uR[i]! + vRefR;
    const vi = uI[i]! + vRefI;
    const P = vr * cr + vi * ci;
    const Q = vi * cr - vr * ci;
    supplyPower += P;
    return { node: s.node, current_A: Math.hypot(cr, ci), angle_deg: (Math.atan2(ci, cr) * 180) / Math.PI, activePower_W: P, reactivePower_var: Q };
  });

  // --- temperatures
  const ambient = inp.ambient_C;
  const maxPerSpec = largestCurrentPerSpec(sSpec, specCount, iR, iI);
  let maxTableError = 0;
  inp.conductors.forEach((c, s) => {
    if (!c.arrangement) return;
    const prepared = prepareBusbar({
      arrangement: c.arrangement as BarArrangement,
      materialId: c.materialId,
      ...(c.temperId ? { temperId: c.temperId } : {}),
      emissivity: finishEmissivity(material(c.materialId).metal, c.finish),
      ambient_C: ambient,
      acRatio: specs[s]!.acRatio,
    });
    try {
      specs[s]!.thermal = buildThermalTable(prepared, maxPerSpec[s]!);
      maxTableError = Math.max(maxTableError, specs[s]!.thermal!.maxError_K);
    } catch (e) {
      if (e instanceof EngineError) warnings.push({ code: e.code, message: `conductor ${c.id}: ${e.message}` });
      else throw e;
    }
  });
  const { segments, anyTemp, overloads, maxUtil, hotTemp, runaway, hotPerSpec } = segmentResults(tables, specs, { sFrom, sTo, sR, sX, live, uR, uI }, iR, iI, vRefR, vRefI, ambient, ac);
  const hottestBasis = anyTemp ? "temperature" : "current-density";
  const top = hottestTen(segments, anyTemp);
  const hottest = top.map((s) => ({ id: s.id, currentDensity_A_per_mm2: s.currentDensity_A_per_mm2, ...(s.temperature_C !== undefined ? { temperature_C: s.temperature_C } : {}) }));
  inp.conductors.forEach((c, s) => {
    const worst = hotPerSpec[s]!;
    if (worst > c.conductorTemperature_C + 5)
      warnings.push({
        code: "resistance-temperature",
        message: `conductor ${c.id}: segments reach ${worst.toFixed(1)} °C, above the ${c.conductorTemperature_C} °C used for the resistance; drops and losses are underestimated.`,
      });
  });

  if (runaway.length)
    warnings.push({
      code: "thermal-runaway",
      message: `${runaway.length} bar segment(s) have no steady temperature below 2000 °C at their current (far above any rating): ${runaway.slice(0, 10).join(", ")}${runaway.length > 10 ? ", …" : ""}`,
    });
  // --- checks, formulas
  if (overloads) warnings.push({ code: "overload", message: `${overloads} segment(s) carry more than their ampacity.` });
  if (inp.dropLimit_pct !== undefined && maxDrop) checks.push(check("drop", `Largest voltage drop (${maxDrop.node}) ≤ limit`, maxDrop.drop_pct, inp.dropLimit_pct, "%"));
  if (inp.conductors.some((c) => c.ampacity_A !== undefined)) checks.push(check("ampacity", "Highest segment current / ampacity ≤ 1", maxUtil, 1, ""));
  if (anyTemp && inp.conductors.some((c) => c.arrangement)) checks.push(check("temperature", "Hottest bar segment ≤ maximum conductor temperature", hotTemp, inp.maxTemperature_C, "°C"));

  formulas.push(
    { id: "r-seg", expression: "R = ρ_20·(β + θ)/(β + 20)·L/(n·A)·k_ac", source: "IEC 60287-1-1:2006 §2.1.1; k_ac = Rac/Rdc (given, or the filament method for bar arrangements)" },
    ac
      ? { id: "nodal", expression: "Y_uu·V_u = −I_load − Y_us·V_s, y = 1/(R + jX)", source: "Nodal analysis (Kirchhoff's current law at every free node, phasor form)" }
      : { id: "nodal", expression: "G_uu·V_u = −I_load − G_us·V_s, g = 1/R", source: "Nodal analysis (Kirchhoff's current law at every free node)" },
    { id: "solver", expression: `‖b − A·x‖₂ ≤ ${DEFAULT_TOLERANCE}·‖b‖₂, or backward error ‖b − A·x‖∞/(‖A‖∞‖x‖∞ + ‖b‖∞) ≤ 64·ε`, source: "RCM + IC(0) + " + (ac ? "COCG (van der Vorst & Melissen 1990)" : "PCG (Saad 2003, Alg. 9.1)") },
    { id: "loss", expression: "P = |I|²·R per segment", source: "Joule's law" },
    { id: "drop", expression: "ΔU = |V_ref| − |V_node|", source: "common practice (drop as the difference of magnitudes)" },
  );
  if (inp.conductors.some((c) => c.ampacity_A !== undefined && !c.arrangement))
    formulas.push({ id: "temperature-ampacity", expression: "θ = θ_a + (θ_max − θ_a)·(I/I_z)²", source: "common practice (steady-state heating proportional to I²)" });
  if (inp.conductors.some((c) => c.arrangement))
    formulas.push({ id: "temperature-bar", expression: "I²·R_ac(θ) = q_conv(θ) + q_rad(θ), tabulated in I² and interpolated", source: "heat balance of busbar-thermal.ts; table error stated in intermediates" });

  intermediates.unknowns = q("Free nodes solved", nu, "");
  intermediates.deadEndNodes = q("Dead-end nodes (no current)", pruneOrder.length, "");
  intermediates.maxKclResidual = q("Largest KCL residual", maxKcl, "A");
  intermediates.totalLoss = q("Total loss", totalLoss, "W");
  if (solver) {
    intermediates.iterations = q("Solver iterations", solver.iterations, "");
    intermediates.relativeResidual = q("Relative residual ‖b − Ax‖/‖b‖", solver.trueRelativeResidual, "");
    intermediates.backwardError = q("Normwise backward error", solver.backwardError, "");
  }
  if (maxTableError > 0) intermediates.thermalTableError = q("Largest temperature interpolation error", maxTableError, "K");

  return {
    kind: "bus-network",
    engineVersion: ENGINE_VERSION,
    results: {
      mode: inp.mode,
      nodes,
      segments,
      supplies,
      totalLoss_W: totalLoss,
      loadPower_W: loadPower,
      supplyPower_W: supplyPower,
      maxDrop,
      hottest,
      hottestBasis,
      maxKclResidual_A: maxKcl,
      solver,
      deadEndNodes: pruneOrder.length,
      isolatedNodes,
    },
    intermediates,
    formulas,
    warnings,
    checks,
  };
}

export interface PathPoint {
  node: string;
  /** Segment arriving at this node (null for the first point). */
  segment: string | null;
  distance_m: number;
  voltage_V?: number | null;
  drop_V?: number | null;
}

/**
 * The route between two nodes with the fewest segments (breadth-first search over the
 * segments) and the cumulative distance along it; with a solved result, the voltage
 * at every point — the data of the "voltage along a path" plot.
 */
export function pathBetween(network: NetworkInput, fromNode: string, toNode: string, result?: CalcResult<NetworkResults>): PathPoint[] {
  const index = new Map<string, number>();
  network.nodes.forEach((nd, i) => index.set(nd.id, i));
  const s = index.get(fromNode);
  const t = index.get(toNode);
  if (s === undefined) throw new EngineError("unknown-node", `node "${fromNode}" is not in the network`, "fromNode");
  if (t === undefined) throw new EngineError("unknown-node", `node "${toNode}" is not in the network`, "toNode");
  const n = network.nodes.length;
  const adj: { seg: number; to: number }[][] = Array.from({ length: n }, () => []);
  network.segments.forEach((sg, k) => {
    const a = index.get(sg.from);
    const b = index.get(sg.to);
    if (a === undefined || b === undefined) throw new EngineError("unknown-node", `segment "${sg.id}" refers to a node that is not in the network`, `segments.${k}`);
    adj[a]!.push({ seg: k, to: b });
    adj[b]!.push({ seg: k, to: a });
  });
  const via = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const seen = new Uint8Array(n);
  const queue = [s];
  seen[s] = 1;
  for (let h = 0; h < queue.length && !seen[t]; h++) {
    const v = queue[h]!;
    for (const e of adj[v]!) {
      if (seen[e.to]) continue;
      seen[e.to] = 1;
      prev[e.to] = v;
      via[e.to] = e.seg;
      queue.push(e.to);
    }
  }
  if (!seen[t]) throw new EngineError("no-path", `no path joins "${fromNode}" and "${toNode}"`, "toNode");
  const chain: number[] = [];
  for (let v = t; v !== -1; v = v === s ? -1 : prev[v]!) chain.push(v);
  chain.reverse();
  let dist = 0;
  return chain.map((v, i) => {
    const seg = i === 0 ? -1 : via[v]!;
    if (seg >= 0) dist += Number(network.segments[seg]!.length_m);
    const pt: PathPoint = { node: network.nodes[v]!.id, segment: seg >= 0 ? network.segments[seg]!.id : null, distance_m: dist };
    if (result) {
      const nr = result.results.nodes[v];
      pt.voltage_V = nr?.voltage_V ?? null;
      pt.drop_V = nr?.drop_V ?? null;
    }
    return pt;
  });
}
