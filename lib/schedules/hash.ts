/**
 * The canonical JSON of a schedule's results, fast: every row has the same keys, so the
 * sorted key list given to JSON.stringify (which then writes keys in that order at every
 * level) yields exactly what `canonicalJson` of lib/hash.ts yields — without sorting
 * each of 20 000 objects one by one. Rows with other keys fall back to `canonicalJson`.
 */
import { canonicalJson, sha256Hex } from "@/lib/hash";
import type { ScheduleRowResult } from "./types";

export function resultsCanonicalJson(results: readonly ScheduleRowResult[]): string {
  const first = results[0];
  if (!first) return "[]";
  const keys = Object.keys(first).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const same = results.every((r) => Object.keys(r).length === keys.length);
  return same ? JSON.stringify(results, keys) : canonicalJson(results);
}

/** SHA-256 over the canonical JSON of the engine version, the options and the results. */
export function scheduleResultsHash(engineVersion: string, options: Record<string, unknown>, results: readonly ScheduleRowResult[]): string {
  // canonicalJson({ engineVersion, options, results }) with the results part written fast.
  const head = canonicalJson({ engineVersion, options });
  return sha256Hex(`${head.slice(0, -1)},"results":${resultsCanonicalJson(results)}}`);
}
