import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { diffJson } from "@/lib/sheets/diff";

describe("diffJson", () => {
  it("reports nothing for equal values, key order ignored", () => {
    expect(diffJson({ a: 1, b: { c: [1, 2, { d: "x" }] } }, { b: { c: [1, 2, { d: "x" }] }, a: 1 })).toEqual([]);
    expect(diffJson(null, null)).toEqual([]);
  });

  it("names changed, added and removed leaves by dotted path, keys sorted", () => {
    const a = { width_m: 0.8, losses: [{ name: "MCCB", loss_W: 30 }], installation: "wall", topFactor: 1.2 };
    const b = { width_m: 1.0, losses: [{ name: "MCCB", loss_W: 45 }, { name: "Contactor", loss_W: 5 }], installation: "wall", ambient_C: 40 };
    expect(diffJson(a, b)).toEqual([
      { path: "ambient_C", kind: "added", to: 40 },
      { path: "losses.0.loss_W", kind: "changed", from: 30, to: 45 },
      { path: "losses.1", kind: "added", to: { name: "Contactor", loss_W: 5 } },
      { path: "topFactor", kind: "removed", from: 1.2 },
      { path: "width_m", kind: "changed", from: 0.8, to: 1.0 },
    ]);
  });

  it("reports a shortened array as removed items", () => {
    expect(diffJson({ l: [1, 2, 3] }, { l: [1] })).toEqual([
      { path: "l.1", kind: "removed", from: 2 },
      { path: "l.2", kind: "removed", from: 3 },
    ]);
  });

  it("reports a change of type as one change at that path", () => {
    expect(diffJson({ p: { mode: "table" } }, { p: [1] })).toEqual([{ path: "p", kind: "changed", from: { mode: "table" }, to: [1] }]);
    expect(diffJson({ p: "3" }, { p: 3 })).toEqual([{ path: "p", kind: "changed", from: "3", to: 3 }]);
    expect(diffJson({ p: null }, { p: {} })).toEqual([{ path: "p", kind: "changed", from: null, to: {} }]);
  });

  it("treats undefined keys as absent and the root as path ''", () => {
    expect(diffJson({ a: undefined, b: 1 }, { b: 1 })).toEqual([]);
    expect(diffJson(1, 2)).toEqual([{ path: "", kind: "changed", from: 1, to: 2 }]);
    expect(diffJson(undefined, { a: 1 })).toEqual([{ path: "", kind: "added", to: { a: 1 } }]);
  });

  it("diff of x with itself is empty, and x vs y is empty exactly when their canonical JSON is equal", () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.jsonValue(), (x, y) => {
        expect(diffJson(x, x)).toEqual([]);
        const canon = (v: unknown): string =>
          JSON.stringify(v, (_k, val: unknown) =>
            val && typeof val === "object" && !Array.isArray(val) ? Object.fromEntries(Object.entries(val).sort(([a], [b]) => (a < b ? -1 : 1))) : val,
          );
        // -0 and 0 serialise alike but differ as numbers only by sign: normalise through JSON first.
        const nx = JSON.parse(JSON.stringify(x)) as unknown;
        const ny = JSON.parse(JSON.stringify(y)) as unknown;
        expect(diffJson(nx, ny).length === 0).toBe(canon(nx) === canon(ny));
      }),
      { numRuns: 300 },
    );
  });

  // Paths are unambiguous for keys that are non-empty and contain no dot (true of every engine input field).
  it("every reported path leads to the reported values", () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string({ minLength: 1, maxLength: 3 }).filter((k) => !k.includes(".") && k !== "__proto__"), fc.jsonValue({ maxDepth: 2 })), fc.dictionary(fc.string({ minLength: 1, maxLength: 3 }).filter((k) => !k.includes(".") && k !== "__proto__"), fc.jsonValue({ maxDepth: 2 })), (x, y) => {
        const nx = JSON.parse(JSON.stringify(x)) as Record<string, unknown>;
        const ny = JSON.parse(JSON.stringify(y)) as Record<string, unknown>;
        // The precondition holds at every depth, not only for the top-level keys.
        const keysOk = (v: unknown): boolean =>
          Array.isArray(v) ? v.every(keysOk) : v && typeof v === "object" ? Object.entries(v).every(([k, w]) => k !== "" && !k.includes(".") && keysOk(w)) : true;
        fc.pre(keysOk(nx) && keysOk(ny));
        const at = (root: unknown, path: string): unknown =>
          path === "" ? root : path.split(".").reduce<unknown>((v, k) => (v && typeof v === "object" ? (v as Record<string, unknown>)[k] : undefined), root);
        for (const c of diffJson(nx, ny)) {
          if (c.kind !== "added") expect(at(nx, c.path)).toEqual(c.from);
          if (c.kind !== "removed") expect(at(ny, c.path)).toEqual(c.to);
        }
      }),
      { numRuns: 300 },
    );
  });
});
