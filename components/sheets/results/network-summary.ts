import type { NetworkResults, SegmentResult } from "@/lib/engine/network";

/**
 * Pure helpers of the bus network results, usable on the server (a large network's
 * summary page) and in the browser.
 */

/** Dead-end segments listed by id before the list is cut short. */
export const DEAD_SHOWN = 40;

/** The segments that carry no current: unloaded dead ends the engine peeled off (exactly 0 A). */
export function deadSegments(r: NetworkResults): SegmentResult[] {
  return r.segments.filter((s) => s.current_A === 0 && s.direction === 0);
}

/**
 * The part of a large network's result a summary page sends to the browser: the
 * headline values, the hottest segments and the first dead-end segments (the full
 * result of 10⁵ segments is tens of MB).
 */
export function summaryOfNetworkResults(r: NetworkResults): { results: NetworkResults; counts: { nodes: number; segments: number }; deadTotal: number } {
  const hot = new Set(r.hottest.map((h) => h.id));
  const dead = deadSegments(r);
  const keep = r.segments.filter((s) => hot.has(s.id));
  // A stored large result (lib/engine/network.ts compactNetworkResult) carries its counts in the columns.
  const { columns, ...rest } = r;
  return {
    results: { ...rest, nodes: [], segments: [...keep, ...dead.slice(0, DEAD_SHOWN)], isolatedNodes: r.isolatedNodes.slice(0, 20) },
    counts: columns ? { nodes: columns.nodes.id.length, segments: columns.segments.id.length } : { nodes: r.nodes.length, segments: r.segments.length },
    deadTotal: columns ? columns.deadSegmentCount : dead.length,
  };
}

