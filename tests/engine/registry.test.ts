import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { CALC_KIND_NAMES, CALC_KINDS, ENGINE_VERSION, runCalc, type RunOutcome } from "../../lib/engine";

/**
 * The registry contract: every kind runs its example input (tests/engine/fixtures/<kind>.json)
 * to a complete CalcResult, and bad input of any shape comes back as field messages —
 * `runCalc` never throws. These are robustness checks (no reference values involved).
 */

const FIXTURES = path.join(__dirname, "fixtures");
const fixture = (kind: string): Record<string, unknown> => JSON.parse(readFileSync(path.join(FIXTURES, `${kind}.json`), "utf8")) as Record<string, unknown>;

/** runCalc, failing the test with the kind and the input when it throws. */
function run(kind: string, input: unknown): RunOutcome {
  try {
    return runCalc(kind, input);
  } catch (e) {
    throw new Error(`runCalc("${kind}") threw for input ${JSON.stringify(input)}: ${(e as Error).stack}`);
  }
}

function expectCompleteResult(kind: string, out: RunOutcome) {
  if (!out.ok) throw new Error(`${kind}: expected a result, got field errors ${JSON.stringify(out.fields)}`);
  const r = out.result;
  expect(r.engineVersion).toBe(ENGINE_VERSION);
  expect(typeof r.kind).toBe("string");
  expect(r.results).toBeTypeOf("object");
  expect(r.formulas.length).toBeGreaterThan(0);
  for (const f of r.formulas) {
    expect(f.expression.trim().length, `${kind} formula ${f.id} expression`).toBeGreaterThan(0);
    expect(f.source.trim().length, `${kind} formula ${f.id} source`).toBeGreaterThan(0);
  }
  for (const w of r.warnings) {
    expect(w.code.length).toBeGreaterThan(0);
    expect(w.message.length).toBeGreaterThan(0);
  }
  for (const c of r.checks) expect(Number.isNaN(c.value)).toBe(false);
  // The result crosses a worker or HTTP boundary as JSON.
  expect(() => JSON.stringify(r)).not.toThrow();
}

function expectFieldMessages(out: RunOutcome): Record<string, string> {
  if (out.ok) throw new Error(`expected field errors, got a result of kind ${out.result.kind}`);
  const entries = Object.entries(out.fields);
  expect(entries.length).toBeGreaterThan(0);
  for (const [field, message] of entries) {
    expect(field.length).toBeGreaterThan(0);
    expect(typeof message).toBe("string");
    expect(message.trim().length).toBeGreaterThan(0);
  }
  return out.fields;
}

describe("registry: every kind has an example input that runs", () => {
  it("there is one fixture per kind and no fixture without a kind", () => {
    const files = readdirSync(FIXTURES)
      .filter((f) => f.endsWith(".json"))
      .map((f) => f.slice(0, -5))
      .sort();
    expect(files).toEqual([...CALC_KIND_NAMES].sort());
  });

  it.each(CALC_KIND_NAMES)("%s: the example gives a CalcResult with formulas and sources", (kind) => {
    expectCompleteResult(kind, run(kind, fixture(kind)));
  });

  it("every kind's example also passes its own schema (the schema is what forms validate against)", () => {
    for (const kind of CALC_KIND_NAMES) expect(CALC_KINDS[kind].schema.safeParse(fixture(kind)).success, kind).toBe(true);
  });

  it("an unknown kind is a field message on `kind`, not an exception", () => {
    const out = run("no-such-kind", {});
    expect(expectFieldMessages(out).kind).toMatch(/Unknown calculation kind "no-such-kind"/);
  });
});

/** Values that are wrong for (almost) any field: junk strings, non-finite and absurd numbers, wrong types. */
const BAD_VALUES: unknown[] = ["NaN", "abc", -1e308, 1e308, "Infinity", "-Infinity", Number.NaN, Number.POSITIVE_INFINITY, null, true, {}, [], ""];

/** Whole inputs of the wrong shape. */
const BAD_INPUTS: unknown[] = [{}, null, undefined, [], [1, 2], "abc", 42, Number.NaN, true];

/** Every path into the example (objects and arrays, inner nodes included). */
function pathsOf(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const out: (string | number)[][] = [];
  if (Array.isArray(value)) value.forEach((v, i) => out.push([...prefix, i], ...pathsOf(v, [...prefix, i])));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) out.push([...prefix, k], ...pathsOf(v, [...prefix, k]));
  return out;
}

function mutate(input: unknown, at: (string | number)[], op: { del: true } | { value: unknown }): unknown {
  const copy = structuredClone(input) as Record<string | number, unknown>;
  let node: Record<string | number, unknown> = copy;
  for (const key of at.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  const last = at[at.length - 1]!;
  if ("del" in op) {
    if (Array.isArray(node)) node.splice(Number(last), 1);
    else delete node[last];
  } else node[last] = op.value;
  return copy;
}

/** True when the reported field is the mutated one, one of its parents or one of its children. */
const related = (field: string, at: (string | number)[]) => {
  const p = at.join(".");
  return field === p || p.startsWith(field + ".") || field.startsWith(p + ".");
};

/**
 * The messages point at the mutated field, or — when the bad value is acceptable on
 * its own (e.g. "abc" as an installation name) and the engine then rejects the
 * combination — at another real field of the input (never the anonymous "_").
 */
function expectNamesField(fields: Record<string, string>, at: (string | number)[], base: Record<string, unknown>, what: string) {
  const keys = Object.keys(fields);
  const ok = keys.some((f) => related(f, at)) || keys.every((f) => f.split(".")[0]! in base);
  expect(ok, `${what}: ${JSON.stringify(fields)}`).toBe(true);
}

describe("registry: bad input never throws and names the field", () => {
  it.each(CALC_KIND_NAMES)("%s: inputs of the wrong shape give field messages", (kind) => {
    for (const bad of BAD_INPUTS) expectFieldMessages(run(kind, bad));
  });

  it.each(CALC_KIND_NAMES)("%s: every top-level field set to a bad value or removed", (kind) => {
    const base = fixture(kind);
    for (const key of Object.keys(base)) {
      for (const value of BAD_VALUES) {
        const out = run(kind, mutate(base, [key], { value }));
        // a few bad values are valid for some fields (e.g. "abc" as a free-text name)
        if (out.ok) expectCompleteResult(kind, out);
        else expectNamesField(expectFieldMessages(out), [key], base, `${kind}.${key} = ${JSON.stringify(value)}`);
      }
      const out = run(kind, mutate(base, [key], { del: true }));
      if (out.ok) expectCompleteResult(kind, out);
      else expectFieldMessages(out);
    }
  });

  it("fuzz: one field anywhere in any example replaced by a bad value or removed (fast-check)", () => {
    const cases = fc.constantFrom(...CALC_KIND_NAMES).chain((kind) =>
      fc.record({
        kind: fc.constant(kind),
        at: fc.constantFrom(...pathsOf(fixture(kind))),
        op: fc.oneof(fc.constantFrom(...BAD_VALUES).map((value) => ({ value })), fc.constant({ del: true as const })),
      }),
    );
    fc.assert(
      fc.property(cases, ({ kind, at, op }) => {
        const out = run(kind, mutate(fixture(kind), at, op));
        if (out.ok) {
          expectCompleteResult(kind, out);
          return;
        }
        const fields = expectFieldMessages(out);
        if ("value" in op) expectNamesField(fields, at, fixture(kind), `${kind} ${at.join(".")} = ${JSON.stringify(op.value)}`);
      }),
      { numRuns: 400, seed: 20240601 },
    );
  });
});
