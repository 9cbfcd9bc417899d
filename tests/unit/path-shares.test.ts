import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { PathShares } from "@/components/sheets/pictures/path-shares";
import { contingencyTable, pathSharesFromParallel, redistribution, redistributionSentence } from "@/components/sheets/pictures/series";
import { ParallelSharingKeyResults } from "@/components/sheets/results/parallel-sharing";
import { parallelSharing, type ParallelSharingInput } from "@/lib/engine/parallel";

// Three DC paths of one size and material: conductance ∝ 1/length, so with 900 A and
// lengths 10, 20, 20 m the shares are 1/2, 1/4, 1/4 (current divider, I_k = I·G_k/ΣG).
const input: ParallelSharingInput = {
  mode: "dc",
  current_A: 900,
  paths: [
    { name: "Short", materialId: "cu-annealed", area_m2: 240e-6, length_m: 10, ampacityPerConductor_A: 500 },
    { name: "Long A", materialId: "cu-annealed", area_m2: 240e-6, length_m: 20, ampacityPerConductor_A: 500 },
    { name: "Long B", materialId: "cu-annealed", area_m2: 240e-6, length_m: 20, ampacityPerConductor_A: 500 },
  ],
};
const result = parallelSharing(input);
const { paths, contingency } = pathSharesFromParallel(result.results, input.paths as { name: string; ampacityPerConductor_A?: number }[]);

describe("one path open: where its current goes", () => {
  it("gives each remaining path its current before and after and the increase", () => {
    // Short open: Long A and Long B share 900 A equally → 450 A each, up from 225 A.
    const rows = redistribution(paths, contingency[0]!);
    expect(rows.map((r) => r.name)).toEqual(["Short", "Long A", "Long B"]);
    expect(rows[0]!.isOpen).toBe(true);
    expect(rows[0]!.after).toBe(0);
    expect(rows[1]!.before).toBeCloseTo(225, 9);
    expect(rows[1]!.after).toBeCloseTo(450, 9);
    expect(rows[1]!.increase).toBeCloseTo(225, 9);
    expect(rows[1]!.increaseRatio).toBeCloseTo(1, 9);
    expect(rows[1]!.afterUtilisation).toBeCloseTo(0.9, 9);
    expect(rows.some((r) => r.overloaded)).toBe(false);
    expect(redistributionSentence("Short", rows)).toBe("With Short open, every remaining path stays within its ampacity.");
  });

  it("names the path that then exceeds its ampacity", () => {
    // Long A open: Short takes 2/3 of 900 A = 600 A > 500 A; Long B 300 A.
    const rows = redistribution(paths, contingency[1]!);
    expect(rows.find((r) => r.name === "Short")!.after).toBeCloseTo(600, 9);
    expect(rows.filter((r) => r.overloaded).map((r) => r.name)).toEqual(["Short"]);
    expect(redistributionSentence("Long A", rows)).toBe("With Long A open, Short carries 600 A, 120 % of its 500 A ampacity: it is overloaded.");
  });

  it("lists every case with its highest loaded path and verdict, the worst one first in rank", () => {
    const t = contingencyTable(paths, contingency);
    expect(t.rows.map((r) => [r.openPath, r.highest?.name, r.verdict])).toEqual([
      ["Short", "Long A", "pass"],
      ["Long A", "Short", "fail"],
      ["Long B", "Short", "fail"],
    ]);
    expect(t.rows[1]!.highest!.utilisation).toBeCloseTo(1.2, 9);
    expect(t.rows[1]!.overloaded).toEqual(["Short"]);
    expect(["Long A", "Long B"]).toContain(t.rows[t.worst]!.openPath);
    const unrated = contingencyTable(paths.map(({ ampacity_A: _a, ...p }) => p), contingency);
    expect(unrated.rows.every((r) => r.verdict === "not rated")).toBe(true);
  });

  it("shows the redistribution under the chart with the overloaded path in words", () => {
    const html = renderToStaticMarkup(createElement(PathShares, { paths, contingency, initialOpenPath: "Long B" }));
    expect(html).toContain('data-testid="redistribution"');
    expect(html).toMatch(/<tr data-path="Short" data-overloaded=""[^>]*>.*?Overloaded<\/span><\/td><\/tr>/);
    expect(html).toContain("With Long B open, Short carries 600 A, 120 % of its 500 A ampacity: it is overloaded.");
    // Short 450 → 600 A, Long A 225 → 300 A: both +33 %.
    expect(html).toMatch(/\+150 A \(\+33 %\)/);
    expect(html).toMatch(/\+75 A \(\+33 %\)/);
  });

  it("shows the N−1 table on the sheet with the engine's worst case highlighted", () => {
    const html = renderToStaticMarkup(createElement(ParallelSharingKeyResults, { results: result.results, inputs: input as unknown as Record<string, unknown>, unitSystem: "metric" }));
    expect(html).toContain('data-testid="contingency-table"');
    const worst = result.results.worstContingency.openPath;
    expect(html).toMatch(new RegExp(`<tr data-open-path="${worst}" data-worst=""`));
    expect(html).toContain("Fail: Short overloaded");
    expect(html).toContain("Worst case");
  });
});
