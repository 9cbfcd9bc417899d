/**
 * Layout and colours of the bus-network diagram: pure functions (no React), shared by
 * the web picture, the PDF drawing and the tests.
 *
 * Layout: a layered drawing of the network's breadth-first tree from its supplies.
 * Every node sits in the column of its hop count from the nearest supply (supplies in
 * column 0, on the left); a node shares the row of its first child and its other
 * subtrees are packed below by their contours, so tree edges between two columns keep
 * their order and never cross. The deepest subtree goes first, so the main run of a
 * bus stays on one straight row and the drops hang right below it. Links that
 * close a mesh are drawn as straight (or, between nodes of one column or for a second
 * link between the same two nodes, bowed) lines. Everything is deterministic (input
 * order breaks every tie) and O(n log n): one BFS, one sort of each child list, one
 * walk.
 */
import type { NetworkResults } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { mixHex } from "./density-colours";
import { plain } from "./format-text";
import { niceAxis } from "./series";
import config from "@/tailwind.config";

/** Beyond this many segments the diagram is not drawn (the hottest list stands in). */
export const NETWORK_DRAW_LIMIT = 5000;
/** Beyond this many segments the diagram is drawn without node labels. */
export const NETWORK_LABEL_LIMIT = 2000;

// ---------------------------------------------------------------------------------
// Topology
// ---------------------------------------------------------------------------------

export interface Topology {
  nodes: string[];
  segments: { id: string; from: string; to: string; length_m: number }[];
  /** Supply nodes, in the order of the input's supplies. */
  supplies: string[];
  /** Nodes with a load, in input order, each once. */
  loads: string[];
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const idOf = (v: unknown): string | null => (typeof v === "string" && v.trim() !== "" ? v.trim() : null);

/**
 * The topology of a network input, read loosely (form state or stored JSON): records
 * without usable ids are skipped; lengths that are not numbers count as 0.
 */
export function topologyOf(input: unknown): Topology {
  const r = isRecord(input) ? input : {};
  const arr = (k: string) => (Array.isArray(r[k]) ? (r[k] as unknown[]) : []);
  const nodes: string[] = [];
  for (const n of arr("nodes")) {
    const id = isRecord(n) ? idOf(n.id) : null;
    if (id) nodes.push(id);
  }
  const segments: Topology["segments"] = [];
  for (const s of arr("segments")) {
    if (!isRecord(s)) continue;
    const id = idOf(s.id);
    const from = idOf(s.from);
    const to = idOf(s.to);
    if (!id || !from || !to) continue;
    const len = Number(s.length_m);
    segments.push({ id, from, to, length_m: Number.isFinite(len) && len > 0 ? len : 0 });
  }
  const pick = (k: string) => {
    const seen = new Set<string>();
    for (const x of arr(k)) {
      const id = isRecord(x) ? idOf(x.node) : null;
      if (id) seen.add(id);
    }
    return [...seen];
  };
  return { nodes, segments, supplies: pick("supplies"), loads: pick("loads") };
}

/**
 * A key that changes only when the drawing's topology changes (not with lengths or
 * currents): the topology without lengths, as JSON, so `topologyFromKey` gives it back.
 */
export function topologyKey(t: Topology): string {
  return JSON.stringify([t.nodes, t.supplies, t.loads, t.segments.map((s) => [s.id, s.from, s.to])]);
}

/** The topology a key was made from (lengths 0: the layout does not use them). */
export function topologyFromKey(key: string): Topology {
  const [nodes, supplies, loads, segs] = JSON.parse(key) as [string[], string[], string[], [string, string, string][]];
  return { nodes, supplies, loads, segments: segs.map(([id, from, to]) => ({ id, from, to, length_m: 0 })) };
}

// ---------------------------------------------------------------------------------
// Layout
// ---------------------------------------------------------------------------------

export type NodeRole = "supply" | "load" | "junction";

export interface PlacedNode {
  id: string;
  /** Position in the unit box, 0…1 (x: columns left to right; y: rows top to bottom). */
  x: number;
  y: number;
  layer: number;
  row: number;
  role: NodeRole;
  /** Whether a path joins the node to a supply. */
  reached: boolean;
  /** No children in the drawing's tree (its label goes to the right). */
  leaf: boolean;
  /** Index of the parent in the tree, −1 for a root. */
  parent: number;
  /** Index of the supply (in `Topology.supplies`) whose tree holds the node, −1 when unreached. */
  supply: number;
}

export interface PlacedSegment {
  id: string;
  /** Node indices; −1 when the segment names a node that is not in the list (not drawn). */
  from: number;
  to: number;
  /** Polyline in the unit box; empty when the segment cannot be drawn. */
  points: [number, number][];
  /** Part of the breadth-first tree (otherwise it closes a mesh or doubles a link). */
  tree: boolean;
}

/** Top and bottom row of a subtree at each depth, deepest first; stored values + shift = rows relative to the subtree's root. */
interface Contour {
  top: number[];
  bot: number[];
  shift: number;
}

export interface NetworkLayout {
  /** In the order of `Topology.nodes`. */
  nodes: PlacedNode[];
  /** In the order of `Topology.segments`. */
  segments: PlacedSegment[];
  nodeIndex: Map<string, number>;
  /** Number of columns (largest hop count + 1) and rows. */
  layers: number;
  rows: number;
}

export function layoutNetwork(t: Topology): NetworkLayout {
  const n = t.nodes.length;
  const m = t.segments.length;
  const nodeIndex = new Map<string, number>();
  t.nodes.forEach((id, i) => {
    if (!nodeIndex.has(id)) nodeIndex.set(id, i);
  });
  const sFrom = new Int32Array(m);
  const sTo = new Int32Array(m);
  const deg = new Int32Array(n + 1);
  for (let k = 0; k < m; k++) {
    const s = t.segments[k]!;
    const a = nodeIndex.get(s.from) ?? -1;
    const b = nodeIndex.get(s.to) ?? -1;
    const ok = a >= 0 && b >= 0 && a !== b;
    sFrom[k] = ok ? a : -1;
    sTo[k] = ok ? b : -1;
    if (ok) {
      deg[a + 1]!++;
      deg[b + 1]!++;
    }
  }
  // CSR adjacency in segment order (deterministic).
  for (let i = 0; i < n; i++) deg[i + 1] = deg[i + 1]! + deg[i]!;
  const adj = new Int32Array(deg[n]!);
  const fill = deg.slice(0, n);
  for (let k = 0; k < m; k++) {
    if (sFrom[k]! < 0) continue;
    adj[fill[sFrom[k]!]!++] = k;
    adj[fill[sTo[k]!]!++] = k;
  }

  const supplyOf = new Int32Array(n).fill(-1);
  const loaded = new Uint8Array(n);
  t.supplies.forEach((id, k) => {
    const i = nodeIndex.get(id);
    if (i !== undefined && supplyOf[i]! < 0) supplyOf[i] = k;
  });
  for (const id of t.loads) {
    const i = nodeIndex.get(id);
    if (i !== undefined) loaded[i] = 1;
  }

  // Breadth-first forest: supplies first (one source set), then each unreached part from its first node.
  const depth = new Int32Array(n).fill(-1);
  const parent = new Int32Array(n).fill(-1);
  const parentSeg = new Int32Array(n).fill(-1);
  const tree = new Int32Array(n).fill(-1);
  const order = new Int32Array(n);
  let qt = 0;
  const roots: number[] = [];
  const bfs = (from: number) => {
    for (let h = from; h < qt; h++) {
      const v = order[h]!;
      for (let p = deg[v]!; p < deg[v + 1]!; p++) {
        const k = adj[p]!;
        const w = sFrom[k] === v ? sTo[k]! : sFrom[k]!;
        if (depth[w]! >= 0) continue;
        depth[w] = depth[v]! + 1;
        parent[w] = v;
        parentSeg[w] = k;
        tree[w] = tree[v]!;
        order[qt++] = w;
      }
    }
  };
  for (let i = 0; i < n; i++) {
    if (supplyOf[i]! < 0 || depth[i]! >= 0) continue;
    depth[i] = 0;
    tree[i] = supplyOf[i]!;
    order[qt++] = i;
  }
  // Supplies in the order given, not in node order.
  const supplyRoots = Array.from(order.subarray(0, qt)).sort((a, b) => supplyOf[a]! - supplyOf[b]!);
  order.set(supplyRoots, 0);
  roots.push(...supplyRoots);
  bfs(0);
  const reachedCount = qt;
  for (let i = 0; i < n; i++) {
    if (depth[i]! >= 0) continue;
    depth[i] = 0;
    const start = qt;
    order[qt++] = i;
    roots.push(i);
    bfs(start);
  }

  // Children per node: the deepest subtree first (the main run of a bus), then the largest; discovery order breaks ties.
  const size = new Int32Array(n).fill(1);
  const height = new Int32Array(n).fill(1);
  for (let h = n - 1; h >= 0; h--) {
    const v = order[h]!;
    const p = parent[v]!;
    if (p >= 0) {
      size[p] = size[p]! + size[v]!;
      height[p] = Math.max(height[p]!, height[v]! + 1);
    }
  }
  const childPtr = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) if (parent[v]! >= 0) childPtr[parent[v]! + 1]!++;
  for (let i = 0; i < n; i++) childPtr[i + 1] = childPtr[i + 1]! + childPtr[i]!;
  const children = new Int32Array(Math.max(0, n - roots.length));
  {
    const f = childPtr.slice(0, n);
    for (let h = 0; h < n; h++) {
      const v = order[h]!;
      if (parent[v]! >= 0) children[f[parent[v]!]!++] = v;
    }
  }
  const discovery = new Int32Array(n);
  for (let h = 0; h < n; h++) discovery[order[h]!] = h;
  for (let v = 0; v < n; v++) {
    const a = childPtr[v]!;
    const b = childPtr[v + 1]!;
    if (b - a > 1) children.subarray(a, b).sort((x, y) => height[y]! - height[x]! || size[y]! - size[x]! || discovery[x]! - discovery[y]!);
  }

  // Rows: subtrees packed by their contours (after Reingold & Tilford 1981, with the
  // parent on its first child's row). Each sibling subtree goes as high as it can while
  // staying one row below everything of the subtrees before it at every shared depth,
  // so a bus's drops hang right under it and the order of every column is the order of
  // the tree: edges between two columns keep their order and cannot cross. Contours are
  // kept deepest level first with a lazy shift and merged into the longer one, so each
  // merge costs the shorter contour's length: O(n) in all.
  const offset = new Int32Array(n);
  const contour: (Contour | undefined)[] = new Array(n);
  for (let h = n - 1; h >= 0; h--) {
    const v = order[h]!;
    const a = childPtr[v]!;
    const b = childPtr[v + 1]!;
    let acc: Contour;
    if (a === b) acc = { top: [], bot: [], shift: 0 };
    else {
      acc = contour[children[a]!]!;
      contour[children[a]!] = undefined;
      offset[children[a]!] = 0;
      for (let p = a + 1; p < b; p++) {
        const c = children[p]!;
        const cc = contour[c]!;
        contour[c] = undefined;
        const la = acc.top.length;
        const lc = cc.top.length;
        const L = Math.min(la, lc);
        let o = -Infinity;
        for (let k = 0; k < L; k++) o = Math.max(o, acc.bot[la - 1 - k]! + acc.shift - (cc.top[lc - 1 - k]! + cc.shift) + 1);
        offset[c] = o;
        if (la >= lc) {
          for (let k = 0; k < L; k++) acc.bot[la - 1 - k] = cc.bot[lc - 1 - k]! + cc.shift + o - acc.shift;
        } else {
          cc.shift += o;
          for (let k = 0; k < L; k++) cc.top[lc - 1 - k] = acc.top[la - 1 - k]! + acc.shift - cc.shift;
          acc = cc;
        }
      }
    }
    acc.top.push(-acc.shift);
    acc.bot.push(-acc.shift);
    contour[v] = acc;
  }
  const row = new Int32Array(n);
  let next = 0;
  const stack: number[] = [];
  roots.forEach((r, k) => {
    // One blank row between separate trees.
    const base = k > 0 ? next + 1 : 0;
    row[r] = base;
    stack.push(r);
    while (stack.length) {
      const v = stack.pop()!;
      next = Math.max(next, row[v]! + 1);
      for (let p = childPtr[v]!; p < childPtr[v + 1]!; p++) {
        const c = children[p]!;
        row[c] = row[v]! + offset[c]!;
        stack.push(c);
      }
    }
  });
  let maxDepth = 0;
  for (let i = 0; i < n; i++) maxDepth = Math.max(maxDepth, depth[i]!);
  const layers = n > 0 ? maxDepth + 1 : 0;
  const rows = next;
  const colUnit = 1 / Math.max(1, layers - 1);
  const rowUnit = 1 / Math.max(1, rows - 1);
  const X = (i: number) => depth[i]! * colUnit;
  const Y = (i: number) => row[i]! * rowUnit;

  const nodes: PlacedNode[] = t.nodes.map((id, i) => ({
    id,
    x: X(i),
    y: Y(i),
    layer: depth[i]!,
    row: row[i]!,
    role: supplyOf[i]! >= 0 ? "supply" : loaded[i] ? "load" : "junction",
    reached: tree[i]! >= 0 && discovery[i]! < reachedCount,
    leaf: childPtr[i + 1] === childPtr[i],
    parent: parent[i]!,
    supply: discovery[i]! < reachedCount ? tree[i]! : -1,
  }));

  // Polylines. Links between the same two nodes are counted so a second one is bowed clear of the first.
  const pairSeen = new Map<string, number>();
  const clamp = (v: number) => Math.min(1, Math.max(0, v));
  const segments: PlacedSegment[] = t.segments.map((s, k) => {
    const a = sFrom[k]!;
    const b = sTo[k]!;
    if (a < 0) return { id: s.id, from: nodeIndex.get(s.from) ?? -1, to: nodeIndex.get(s.to) ?? -1, points: [], tree: false };
    const isTree = parentSeg[b] === k || parentSeg[a] === k;
    const pairKey = a < b ? `${a} ${b}` : `${b} ${a}`;
    const nth = pairSeen.get(pairKey) ?? 0;
    pairSeen.set(pairKey, nth + 1);
    let points: [number, number][];
    if (isTree) {
      const [p, c] = parentSeg[b] === k ? [a, b] : [b, a];
      points = row[p] === row[c] ? [[X(p), Y(p)], [X(c), Y(c)]] : [[X(p), Y(p)], [X(p) + 0.3 * (X(c) - X(p)), Y(c)], [X(c), Y(c)]];
    } else if (depth[a] === depth[b]) {
      // Same column: bow sideways so the link passes beside the nodes between its ends.
      const off = (0.35 + 0.15 * nth) * colUnit;
      const x = X(a) + off <= 1 || layers <= 1 ? X(a) + off : X(a) - off;
      points = [[X(a), Y(a)], [layers <= 1 ? x : clamp(x), (Y(a) + Y(b)) / 2], [X(b), Y(b)]];
    } else if (nth === 0) {
      points = [[X(a), Y(a)], [X(b), Y(b)]];
    } else {
      const sign = nth % 2 === 1 ? 1 : -1;
      const off = sign * Math.ceil(nth / 2) * 0.3 * rowUnit;
      points = [[X(a), Y(a)], [(X(a) + X(b)) / 2, clamp((Y(a) + Y(b)) / 2 + off)], [X(b), Y(b)]];
    }
    // A tree edge that doubles an earlier link between the same nodes is bowed too.
    if (isTree && nth > 0) {
      const mid = points.length === 2 ? [(points[0]![0] + points[1]![0]) / 2, (points[0]![1] + points[1]![1]) / 2] : points[1]!;
      points = [points[0]!, [mid[0]!, clamp(mid[1]! + 0.3 * rowUnit * nth)], points[points.length - 1]!];
    }
    return { id: s.id, from: a, to: b, points, tree: isTree };
  });
  return { nodes, segments, nodeIndex, layers, rows };
}

/** Proper crossings between drawn segments (shared end points do not count); for tests and checks. */
export function countCrossings(layout: NetworkLayout): number {
  const pieces: { k: number; a: [number, number]; b: [number, number] }[] = [];
  layout.segments.forEach((s, k) => {
    for (let i = 0; i + 1 < s.points.length; i++) pieces.push({ k, a: s.points[i]!, b: s.points[i + 1]! });
  });
  const cross = (o: [number, number], p: [number, number], q: [number, number]) => (p[0] - o[0]) * (q[1] - o[1]) - (p[1] - o[1]) * (q[0] - o[0]);
  const eps = 1e-12;
  let count = 0;
  for (let i = 0; i < pieces.length; i++)
    for (let j = i + 1; j < pieces.length; j++) {
      const P = pieces[i]!;
      const Q = pieces[j]!;
      if (P.k === Q.k) continue;
      const d1 = cross(P.a, P.b, Q.a);
      const d2 = cross(P.a, P.b, Q.b);
      const d3 = cross(Q.a, Q.b, P.a);
      const d4 = cross(Q.a, Q.b, P.b);
      if (((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) && ((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps))) count++;
    }
  return count;
}

// ---------------------------------------------------------------------------------
// Colours
// ---------------------------------------------------------------------------------

export type ColourMode = "rise" | "density" | "voltage" | "voltage-pct";

export const COLOUR_MODES: readonly { mode: ColourMode; label: string }[] = [
  { mode: "rise", label: "Temperature rise" },
  { mode: "density", label: "Current density" },
  { mode: "voltage", label: "Voltage (V)" },
  { mode: "voltage-pct", label: "Voltage (% of nominal)" },
];

const c = config.theme.extend.colors;

/**
 * Sequential map for lines on white paper: pale fen (little) through amber and copper
 * to near-black (most). Relative luminance falls monotonically along it, so the order
 * reads in grey and without colour vision; the signal red stays free to mark overloads.
 */
export const networkStops: readonly string[] = [c.fen[300], c.amberline[500], c.copper[700], c.fen[950]];

/** Colour of a segment that carries no current (drawn dashed) and of one without a value. */
export const networkInk = { noCurrent: c.fen[400], noValue: "#c9d0d0", overload: c.signal[500], selected: c.fen[950] } as const;

/** Colour at intensity t in 0…1 (clamped; NaN counts as 0). */
export function networkColour(t: number): string {
  const s = networkStops;
  const k = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const pos = k * (s.length - 1);
  const i = Math.min(s.length - 2, Math.floor(pos));
  return mixHex(s[i]!, s[i + 1]!, pos - i);
}

/** WCAG relative luminance of #rrggbb (for the monotonicity test and contrast choices). */
export function luminance(hex: string): number {
  const v = parseInt(hex.slice(1), 16);
  const ch = (shift: number) => {
    const x = ((v >> shift) & 255) / 255;
    return x <= 0.04045 ? x / 12.92 : Math.pow((x + 0.055) / 1.055, 2.4);
  };
  return 0.2126 * ch(16) + 0.7152 * ch(8) + 0.0722 * ch(0);
}

/** 1 A/mm² in A/in² (1 in² = 645.16 mm²). */
export const A_PER_IN2_PER_A_PER_MM2 = 645.16;

export interface ColourTick {
  value: number;
  label: string;
  /** Position along the legend, 0 (left, low values) … 1 (right). */
  at: number;
}

export interface ColourScale {
  mode: ColourMode;
  /** "Temperature rise", "Current density", "Voltage". */
  title: string;
  unit: string;
  /** Display-unit range of the legend (values outside are clamped). */
  domain: [number, number];
  ticks: ColourTick[];
  /** Low values are the bad end (voltage): the map runs the other way. */
  reversed: boolean;
  /** Whether any value was known. */
  hasValues: boolean;
}

/** The unit a mode shows in the project's unit system. */
export function modeUnit(mode: ColourMode, units: UnitSystem): string {
  if (mode === "rise") return units === "imperial" ? "°F" : "K";
  if (mode === "density") return units === "imperial" ? "A/in²" : "A/mm²";
  if (mode === "voltage") return "V";
  return "%";
}

export function modeTitle(mode: ColourMode): string {
  return mode === "rise" ? "Temperature rise" : mode === "density" ? "Current density" : mode === "voltage" ? "Voltage" : "Voltage, % of nominal";
}

/** Nominal voltage: the first supply's, V (NaN without a supply). */
export function nominalVoltage(input: unknown): number {
  const r = isRecord(input) ? input : {};
  const first = Array.isArray(r.supplies) ? (r.supplies[0] as unknown) : undefined;
  const v = isRecord(first) ? Number(first.voltage_V) : Number.NaN;
  return Number.isFinite(v) && v > 0 ? v : Number.NaN;
}

/** A node's voltage shown in a mode (V or % of nominal); NaN when unknown. */
export function nodeValue(mode: ColourMode, v: number | null | undefined, nominal_V: number): number {
  if (v === null || v === undefined || !Number.isFinite(v)) return Number.NaN;
  return mode === "voltage-pct" ? (v / nominal_V) * 100 : v;
}

/**
 * One value per segment in the display unit of the mode (NaN where unknown): the
 * temperature rise (K, or °F of rise), the current density (A/mm² or A/in²), or the
 * voltage at the segment's middle taken as the mean of its two ends (V or %).
 */
export function segmentValues(mode: ColourMode, results: Pick<NetworkResults, "segments" | "nodes">, units: UnitSystem, nominal_V = Number.NaN): Float64Array {
  const out = new Float64Array(results.segments.length).fill(Number.NaN);
  if (mode === "voltage" || mode === "voltage-pct") {
    const byId = new Map<string, number>();
    for (const nd of results.nodes) if (nd.voltage_V !== null && Number.isFinite(nd.voltage_V)) byId.set(nd.id, nd.voltage_V);
    results.segments.forEach((s, k) => {
      const a = byId.get(s.from);
      const b = byId.get(s.to);
      if (a !== undefined && b !== undefined) out[k] = nodeValue(mode, (a + b) / 2, nominal_V);
    });
    return out;
  }
  results.segments.forEach((s, k) => {
    if (mode === "rise") {
      if (s.temperatureRise_K !== undefined && Number.isFinite(s.temperatureRise_K)) out[k] = units === "imperial" ? s.temperatureRise_K * 1.8 : s.temperatureRise_K;
    } else if (Number.isFinite(s.currentDensity_A_per_mm2)) out[k] = units === "imperial" ? s.currentDensity_A_per_mm2 * A_PER_IN2_PER_A_PER_MM2 : s.currentDensity_A_per_mm2;
  });
  return out;
}

/** Whether a mode has anything to show (rise needs an ampacity or a bar arrangement). */
export function modeAvailable(mode: ColourMode, results: Pick<NetworkResults, "segments" | "nodes">, nominal_V = Number.NaN): boolean {
  if (mode === "rise") return results.segments.some((s) => s.temperatureRise_K !== undefined && Number.isFinite(s.temperatureRise_K));
  if (mode === "voltage-pct") return Number.isFinite(nominal_V) && results.nodes.some((n) => n.voltage_V !== null);
  if (mode === "voltage") return results.nodes.some((n) => n.voltage_V !== null);
  return results.segments.length > 0;
}

/**
 * The legend's range and ticks: round numbers (1, 2 or 5 × 10ⁿ apart) covering every
 * value; rise and density start at zero. `extra` values (node voltages) widen the range.
 */
export function colourScale(mode: ColourMode, values: ArrayLike<number>, units: UnitSystem, extra: ArrayLike<number> = []): ColourScale {
  const finite: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite.push(values[i]!);
  for (let i = 0; i < extra.length; i++) if (Number.isFinite(extra[i])) finite.push(extra[i]!);
  const fromZero = mode === "rise" || mode === "density";
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of finite) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  const hasValues = finite.length > 0;
  if (!hasValues) {
    lo = 0;
    hi = 1;
  }
  const axis = niceAxis(fromZero ? [0, Math.max(0, hi), ...(hi <= 0 ? [1] : [])] : [lo, hi], 5);
  const [d0, d1] = axis.domain;
  const span = d1 - d0 || 1;
  const figures = mode === "voltage" || mode === "voltage-pct" ? 6 : 4;
  const ticks = axis.ticks.filter((v) => v >= d0 - 1e-9 * span && v <= d1 + 1e-9 * span).map((v) => ({ value: v, label: plain(v, figures), at: (v - d0) / span }));
  return { mode, title: modeTitle(mode), unit: modeUnit(mode, units), domain: [d0, d1], ticks, reversed: mode === "voltage" || mode === "voltage-pct", hasValues };
}

/** Position of a value along the legend, 0…1 (clamped); NaN for an unknown value. */
export function scalePosition(scale: ColourScale, value: number): number {
  if (!Number.isFinite(value)) return Number.NaN;
  const [d0, d1] = scale.domain;
  return Math.min(1, Math.max(0, (value - d0) / (d1 - d0 || 1)));
}

/** Colour of a value on a scale (voltage runs the other way: the lowest voltage is the darkest). */
export function scaleColour(scale: ColourScale, value: number): string {
  const t = scalePosition(scale, value);
  if (Number.isNaN(t)) return networkInk.noValue;
  return networkColour(scale.reversed ? 1 - t : t);
}

/** The legend's gradient, left (low values) to right, in `steps` colours. */
export function scaleGradient(scale: ColourScale, steps = 32): string[] {
  return Array.from({ length: steps }, (_, k) => networkColour(scale.reversed ? 1 - (k + 0.5) / steps : (k + 0.5) / steps));
}

/** A segment that carries no current: exactly zero (a dead end), or nothing against the largest current. */
export function noCurrentMask(results: Pick<NetworkResults, "segments">): Uint8Array {
  let max = 0;
  for (const s of results.segments) if (Number.isFinite(s.current_A)) max = Math.max(max, s.current_A);
  const tol = max * 1e-9;
  return Uint8Array.from(results.segments, (s) => (s.direction === 0 || !(s.current_A > tol) ? 1 : 0));
}

// ---------------------------------------------------------------------------------
// Sizing for a drawing
// ---------------------------------------------------------------------------------

export interface DiagramFrame {
  /** Drawing units (CSS px on screen, points in the PDF). */
  width: number;
  height: number;
  /** Inner box the unit square maps to. */
  left: number;
  top: number;
  innerW: number;
  innerH: number;
  colGap: number;
  rowGap: number;
  /** Whether node labels fit. */
  labels: boolean;
}

/**
 * The size of the drawing for a layout: columns and rows as far apart as reads well,
 * squeezed to fit `maxWidth` × `maxHeight` when given (the PDF), otherwise filling
 * `fitWidth` and growing beyond it only when the columns would crowd (the web page
 * scrolls a large drawing).
 */
export function diagramFrame(
  layout: NetworkLayout,
  segmentCount: number,
  opts: { maxWidth?: number; maxHeight?: number; minWidth?: number; fitWidth?: number } = {},
): DiagramFrame {
  const cols = Math.max(1, layout.layers - 1);
  const rowsN = Math.max(1, layout.rows - 1);
  // fitWidth: the width the page offers; the drawing fills it and scrolls only when columns would get too close.
  let colGap = Math.min(150, Math.max(44, ((opts.fitWidth ?? 1084) - 124) / cols));
  let rowGap = Math.min(34, Math.max(6, 1800 / rowsN));
  const margin = { left: 28, right: 96, top: 26, bottom: 22 };
  if (opts.maxWidth !== undefined) colGap = Math.min(colGap, (opts.maxWidth - margin.left - margin.right) / cols);
  if (opts.maxHeight !== undefined) rowGap = Math.min(rowGap, (opts.maxHeight - margin.top - margin.bottom) / rowsN);
  colGap = Math.max(colGap, 1);
  rowGap = Math.max(rowGap, 1);
  const innerW = layout.layers > 1 ? colGap * cols : 0;
  const innerH = layout.rows > 1 ? rowGap * rowsN : 0;
  const width = Math.max(opts.minWidth ?? 0, innerW + margin.left + margin.right);
  const height = innerH + margin.top + margin.bottom;
  const labels = segmentCount <= NETWORK_LABEL_LIMIT && rowGap >= 15 && colGap >= 40;
  return { width, height, left: margin.left, top: margin.top, innerW: Math.max(innerW, colGap), innerH: Math.max(innerH, rowGap), colGap, rowGap, labels };
}

/** A unit-box point in drawing units. */
export function toFrame(f: DiagramFrame, p: readonly [number, number]): [number, number] {
  return [Math.round((f.left + p[0] * f.innerW) * 100) / 100, Math.round((f.top + p[1] * f.innerH) * 100) / 100];
}

/** SVG path data of a polyline in drawing units. */
export function polylinePath(f: DiagramFrame, points: readonly (readonly [number, number])[]): string {
  return points.map((p, i) => {
    const [x, y] = toFrame(f, p);
    return `${i === 0 ? "M" : "L"}${x} ${y}`;
  }).join("");
}

// ---------------------------------------------------------------------------------
// Node labels
// ---------------------------------------------------------------------------------

export interface NodeLabel {
  x: number;
  y: number;
  anchor: "start" | "middle" | "end";
  text: string;
}

/**
 * Where each node's name goes, or null when it has no room (the hover title still
 * names it). Supplies: to the left. Nodes with branches: centred above. Leaves: to the
 * right when nothing is drawn there (the last column, or a row no fan of the column
 * passes through), otherwise above the end of their own incoming line when the name
 * fits there. Widths are estimated from the character count.
 */
export function nodeLabels(
  layout: NetworkLayout,
  f: DiagramFrame,
  o: { fontSize: number; nodeRadius: number; loadMarker: number; maxChars?: number },
): (NodeLabel | null)[] {
  if (!f.labels) return layout.nodes.map(() => null);
  const charW = o.fontSize * 0.6;
  const maxChars = o.maxChars ?? 18;
  // Per column: the row spans [row + 1, last child row] that a node's fan passes through.
  const last = new Int32Array(layout.nodes.length).fill(-1);
  layout.nodes.forEach((n) => {
    if (n.parent >= 0) last[n.parent] = Math.max(last[n.parent]!, n.row);
  });
  const spans = new Map<number, [number, number][]>();
  layout.nodes.forEach((n, i) => {
    if (last[i]! > n.row) {
      const list = spans.get(n.layer) ?? [];
      list.push([n.row + 1, last[i]!]);
      spans.set(n.layer, list);
    }
  });
  const merged = new Map<number, [number, number][]>();
  for (const [layer, list] of spans) {
    list.sort((a, b) => a[0] - b[0]);
    const out: [number, number][] = [];
    for (const s of list) {
      const top = out[out.length - 1];
      if (top && s[0] <= top[1] + 1) top[1] = Math.max(top[1], s[1]);
      else out.push([s[0], s[1]]);
    }
    merged.set(layer, out);
  }
  const crossed = (layer: number, row: number) => {
    const list = merged.get(layer);
    if (!list) return false;
    let lo = 0;
    let hi = list.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const [a, b] = list[mid]!;
      if (row < a) hi = mid - 1;
      else if (row > b) lo = mid + 1;
      else return true;
    }
    return false;
  };
  const lastLayer = layout.layers - 1;
  return layout.nodes.map((n) => {
    const text = n.id.length > maxChars ? `${n.id.slice(0, maxChars - 1)}…` : n.id;
    const w = text.length * charW;
    const [x, y] = toFrame(f, [n.x, n.y]);
    const mid = y + o.fontSize * 0.35;
    if (n.role === "supply") return { x: x - o.nodeRadius * 1.6 - 3, y: mid, anchor: "end", text };
    if (!n.leaf) return w <= f.colGap * 0.85 ? { x, y: y - o.nodeRadius - 5, anchor: "middle", text } : null;
    const right = o.nodeRadius + 4 + (n.role === "load" ? o.loadMarker + 3 : 0);
    // A fan of the same column through this row is the only thing drawn to the right of a leaf (its child edges included).
    if (!crossed(n.layer, n.row) && (n.layer === lastLayer || w <= f.colGap - right - 8)) return { x: x + right, y: mid, anchor: "start", text };
    // Above the node's own incoming line, which is straight for the last 70 % of the column gap.
    if (n.parent >= 0 && w <= f.colGap * 0.62 && f.rowGap >= o.fontSize + 6) return { x: x - o.nodeRadius - 3, y: y - 4, anchor: "end", text };
    return null;
  });
}
