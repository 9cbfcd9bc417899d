/**
 * Data of the "voltage along a path" picture of a bus network: the route from a supply
 * to a chosen node (the engine's pathBetween: fewest segments), the voltage at every
 * node on it, and the stretches that carry no current kept apart so they draw flat
 * and dashed. Pure (no React, no chart library): the web chart, the PDF and the tests
 * share it.
 */
import { EngineError } from "@/lib/engine/core/result";
import { pathBetween, type NetworkInput, type NetworkResults } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { plain } from "./format-text";
import { nominalVoltage, noCurrentMask, topologyOf } from "./network-layout";
import { niceAxis } from "./series";
import { displayDistance, distanceUnit } from "./units";

export interface LoadChoice {
  node: string;
  voltage_V: number | null;
  drop_pct: number | null;
}

/** The load nodes with their voltages, lowest voltage first (input order breaks ties; unknown voltages last). */
export function loadChoices(input: NetworkInput, results: Pick<NetworkResults, "nodes">): LoadChoice[] {
  const t = topologyOf(input);
  const byId = new Map(results.nodes.map((n) => [n.id, n]));
  const out = t.loads.map((node) => ({ node, voltage_V: byId.get(node)?.voltage_V ?? null, drop_pct: byId.get(node)?.drop_pct ?? null }));
  return out
    .map((c, i) => ({ c, i }))
    .sort((a, b) => (a.c.voltage_V ?? Infinity) - (b.c.voltage_V ?? Infinity) || a.i - b.i)
    .map((x) => x.c);
}

export interface NetworkPathRow {
  distance: number;
  /** Voltage on a stretch that carries current (null elsewhere: the line breaks there). */
  live?: number | null;
  /** Voltage on a stretch that carries no current. */
  dead?: number | null;
  node?: string;
}

export interface NetworkPathSeries {
  distUnit: "m" | "ft";
  /** Node ids from the supply to the end. */
  route: string[];
  segments: number;
  /** Route length in the display unit. */
  length: number;
  rows: NetworkPathRow[];
  /** The path's points (one per node) in the display unit, for the PDF. */
  points: { distance: number; distance_m: number; voltage: number; node: string }[];
  nominal?: number;
  /** Lowest voltage the drop limit allows, V. */
  limit?: number;
  /** Whether the limit lies within the plotted range (far below the path it is left out of the axis). */
  limitShown?: boolean;
  endVoltage?: number;
  drop_V?: number;
  drop_pct?: number;
  deadSegments: number;
  xDomain: [number, number];
  yDomain: [number, number];
  xTicks: number[];
  yTicks: number[];
}

/** The route from the nearest supply (fewest segments) to `toNode`, with voltages; an error message when there is none. */
export function networkPathSeries(input: NetworkInput, results: Pick<NetworkResults, "nodes" | "segments">, toNode: string, units: UnitSystem): NetworkPathSeries | { error: string } {
  const t = topologyOf(input);
  if (t.supplies.length === 0) return { error: "The network has no supply to start a path from." };
  let best: ReturnType<typeof pathBetween> | undefined;
  let lastError = "";
  for (const s of t.supplies) {
    try {
      const p = pathBetween(input, s, toNode);
      if (!best || p.length < best.length) best = p;
    } catch (e) {
      // Half-typed form state can hold anything: the picture says why it has no path instead of failing.
      lastError = e instanceof EngineError || e instanceof Error ? e.message : String(e);
    }
  }
  if (!best) return { error: lastError || `No path joins a supply and ${toNode}.` };
  const volts = new Map(results.nodes.map((n) => [n.id, n]));
  const dead = noCurrentMask(results);
  const deadById = new Map(results.segments.map((s, k) => [s.id, dead[k] === 1]));
  const rows: NetworkPathRow[] = [];
  const points: NetworkPathSeries["points"] = [];
  let prevKind: "live" | "dead" | null = null;
  let deadSegments = 0;
  best.forEach((p, i) => {
    const d = displayDistance(p.distance_m, units);
    const v = volts.get(p.node)?.voltage_V ?? null;
    if (v !== null) points.push({ distance: d, distance_m: p.distance_m, voltage: v, node: p.node });
    if (i === 0) return;
    const prev = best![i - 1]!;
    const pv = volts.get(prev.node)?.voltage_V ?? null;
    const kind = p.segment !== null && deadById.get(p.segment) ? "dead" : "live";
    if (kind === "dead") deadSegments++;
    if (kind !== prevKind) {
      if (prevKind !== null) rows.push({ distance: displayDistance(prev.distance_m, units), live: null, dead: null });
      rows.push({ distance: displayDistance(prev.distance_m, units), [kind]: pv, node: prev.node });
      prevKind = kind;
    }
    rows.push({ distance: d, [kind]: v, node: p.node });
  });
  if (best.length === 1) rows.push({ distance: 0, live: volts.get(best[0]!.node)?.voltage_V ?? null, node: best[0]!.node });

  const nominal = nominalVoltage(input);
  const rec = (input as unknown as Record<string, unknown>) ?? {};
  const limitPct = Number(rec.dropLimit_pct);
  const limit = Number.isFinite(nominal) && Number.isFinite(limitPct) && limitPct > 0 ? nominal * (1 - limitPct / 100) : undefined;
  const end = volts.get(toNode);
  const vs = points.map((p) => p.voltage);
  // The drop limit joins the axis only when it is near the path's voltages; far below, it
  // would squeeze the steps of the path into a thin band (the caption still states it).
  const top = Math.max(...vs, Number.isFinite(nominal) ? nominal : -Infinity);
  const low = Math.min(...vs);
  const limitShown = limit !== undefined && low - limit <= 1.5 * Math.max(top - low, 1e-9);
  const y = niceAxis([...vs, ...(Number.isFinite(nominal) ? [nominal] : []), ...(limitShown ? [limit] : [])], 5);
  const length = displayDistance(best[best.length - 1]!.distance_m, units);
  const x = niceAxis([0, length], 6);
  return {
    distUnit: distanceUnit(units),
    route: best.map((p) => p.node),
    segments: best.length - 1,
    length,
    rows,
    points,
    ...(Number.isFinite(nominal) ? { nominal } : {}),
    ...(limit !== undefined ? { limit, limitShown } : {}),
    ...(end?.voltage_V !== null && end?.voltage_V !== undefined ? { endVoltage: end.voltage_V } : {}),
    ...(end?.drop_V !== null && end?.drop_V !== undefined ? { drop_V: end.drop_V } : {}),
    ...(end?.drop_pct !== null && end?.drop_pct !== undefined ? { drop_pct: end.drop_pct } : {}),
    deadSegments,
    xDomain: [0, length > 0 ? length : 1],
    yDomain: y.domain,
    xTicks: x.ticks.filter((v) => v <= length + 1e-9),
    yTicks: y.ticks,
  };
}

/** "incomer → B1 → B2 → M2"; a long route keeps its first two and last two nodes. */
export function routeText(route: readonly string[]): string {
  if (route.length <= 6) return route.join(" → ");
  return [...route.slice(0, 2), "…", ...route.slice(-2)].join(" → ");
}

/** The caption: "incomer → B1 → B2 → M2: 3 segments, 19.2 m, drop 0.898 V (0.39 %)". */
export function networkPathSummary(s: NetworkPathSeries): string {
  const parts = [`${s.segments} segment${s.segments === 1 ? "" : "s"}`, `${plain(s.length, 3)} ${s.distUnit}`];
  if (s.drop_V !== undefined) parts.push(`drop ${plain(s.drop_V, 3)} V${s.drop_pct !== undefined ? ` (${plain(s.drop_pct, 2)} %)` : ""}`);
  if (s.endVoltage !== undefined) parts.push(`${plain(s.endVoltage, 5)} V at the end`);
  if (s.limit !== undefined && s.endVoltage !== undefined) parts.push(s.endVoltage >= s.limit ? `within the ${plain(s.limit, 5)} V limit` : `BELOW the ${plain(s.limit, 5)} V limit`);
  if (s.deadSegments) parts.push(`${s.deadSegments} stretch${s.deadSegments === 1 ? "" : "es"} without current (flat, dashed)`);
  return `${routeText(s.route)}: ${parts.join(", ")}.`;
}
