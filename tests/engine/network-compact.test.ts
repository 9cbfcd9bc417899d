import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compactNetworkResult, solveNetwork, type NetworkInput } from "@/lib/engine/network";

const fixture = JSON.parse(readFileSync(new URL("./fixtures/bus-network.json", import.meta.url), "utf8")) as NetworkInput;

describe("compactNetworkResult (stored form of a large network's result)", () => {
  it("leaves a result at or under the limit unchanged", () => {
    const full = solveNetwork(fixture);
    expect(compactNetworkResult(full)).toBe(full);
  });

  it("keeps every segment and node as columns to six significant figures, and the hottest in full", () => {
    const full = solveNetwork(fixture);
    const c = compactNetworkResult(full, 2);
    const r = c.results;
    expect(r.nodes).toHaveLength(0);
    expect(r.columns!.segments.id).toEqual(full.results.segments.map((s) => s.id));
    full.results.segments.forEach((s, i) => {
      expect(Math.abs(r.columns!.segments.current_A[i]! - s.current_A)).toBeLessThanOrEqual(5e-6 * Math.max(1, Math.abs(s.current_A)));
    });
    expect(r.columns!.nodes.id).toEqual(full.results.nodes.map((n) => n.id));
    for (const h of r.hottest) expect(r.segments.some((s) => s.id === h.id)).toBe(true);
    // headline values, checks and formulas are untouched
    expect(r.totalLoss_W).toBe(full.results.totalLoss_W);
    expect(c.checks).toEqual(full.checks);
    expect(c.formulas).toEqual(full.formulas);
    // compacting twice changes nothing
    expect(compactNetworkResult(c, 2)).toBe(c);
  });
});
