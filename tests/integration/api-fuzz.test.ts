import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { POST as runKind } from "@/app/api/v1/calc/[kind]/route";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import { CALC_KIND_NAMES } from "@/lib/engine";
import { call, tokenFor } from "../support/api";
import { makeOrg, makeUser } from "../support/db";

// Property: whatever a client posts to /api/v1/calc/{kind}, the answer is a 200 with a
// result or a 400 whose `fields` say what to fix, never a 500. A 500 here is an engine
// bug: report the kind and the smallest failing input (fast-check shrinks it).
// Run counts are bounded so the file finishes in well under a minute.

const RUNS = { anything: 15, object: 12, rawBody: 8, mutations: 40 } as const;

let token: string;

beforeAll(async () => {
  const org = await makeOrg("Fuzz Yard Switchgear");
  token = await tokenFor(await makeUser(org.id, "engineer"), "fuzz");
});

afterAll(async () => {
  await closeDb();
});

async function postRaw(kind: string, body: string | undefined) {
  return call(runKind, { token, params: { kind }, path: `/api/v1/calc/${kind}`, method: "POST", body: body ?? "" });
}

/** The contract: 200 with a CalcResult of this kind, or 400 with at least one named field. */
function expectContract(kind: string, r: Awaited<ReturnType<typeof postRaw>>, sent: string | undefined) {
  const why = `${kind} answered ${r.status} to ${String(sent).slice(0, 600)} → ${JSON.stringify(r.json).slice(0, 300)}`;
  expect([200, 400], why).toContain(r.status);
  if (r.status === 200) {
    expect(r.json.kind, why).toBe(kind);
    expect(Array.isArray(r.json.checks), why).toBe(true);
  } else {
    expect(r.json.error.code, why).toBe("validation");
    const fields = Object.entries(r.json.error.fields ?? {});
    expect(fields.length, why).toBeGreaterThan(0);
    for (const [, message] of fields) expect(typeof message === "string" && message.length > 0, why).toBe(true);
  }
}

/* ------------------------------------------------------------------ */
/* Mutations of a valid input                                            */
/* ------------------------------------------------------------------ */

type Path = (string | number)[];

/** Every node of a JSON value (the root excluded), objects and arrays included. */
function nodePaths(v: unknown, path: Path = [], out: Path[] = []): Path[] {
  if (path.length) out.push(path);
  if (v && typeof v === "object") for (const [k, c] of Object.entries(v)) nodePaths(c, [...path, Array.isArray(v) ? Number(k) : k], out);
  return out;
}

/** JSON texts a JSON encoder would never write, placed raw into the body. */
const RAW_LITERALS = ["1e999", "-1e999", "1e-999", "-0", "NaN", "Infinity", "-Infinity", "0x1F", "+1", ".5", "5.", "01", "99999999999999999999999", "1e308", "4.9e-324", "\"1e999\""];

/** Values typed wrongly or at the edges: NaN-like strings, huge, negative, tiny, empty. */
const edgeValue = fc.oneof(
  fc.constantFrom("NaN", "Infinity", "-Infinity", "1e309", "-1e309", "1e-400", "", " ", "abc", "0x10", "1,5", "١٢", "-0", "12 mm"),
  fc.constantFrom(-1, 0, -0, 1e308, -1e308, 5e-324, Number.MAX_SAFE_INTEGER, 2 ** 53 + 1, 1e-12, 0.5, 1, 2, 3, 8, 100, 1e6),
  fc.double(),
  fc.integer({ min: -1000, max: 100_000 }),
  fc.string({ maxLength: 12 }),
  fc.boolean(),
  fc.constant(null),
  fc.constantFrom([], {}, [1, 2], { value: 1 }),
);

type Mutation = { path: Path; op: "set"; value: unknown } | { path: Path; op: "delete" } | { path: Path; op: "raw"; literal: string };

function mutationArb(paths: Path[]): fc.Arbitrary<Mutation[]> {
  const path = fc.constantFrom(...paths);
  const one = fc.oneof(
    { weight: 5, arbitrary: fc.record({ path, op: fc.constant("set" as const), value: edgeValue }) },
    { weight: 2, arbitrary: fc.record({ path, op: fc.constant("delete" as const) }) },
    { weight: 2, arbitrary: fc.record({ path, op: fc.constant("raw" as const), literal: fc.constantFrom(...RAW_LITERALS) }) },
  );
  return fc.array(one, { minLength: 1, maxLength: 3 });
}

/**
 * A copy of a generated value, so a later mutation whose path runs through it cannot
 * write into the generator's own object (two mutations sharing one object made a cycle).
 */
function detached(value: unknown): unknown {
  if (value === null || typeof value !== "object") return value;
  try {
    return structuredClone(value);
  } catch {
    return value;
  }
}

/** Applies mutations to a copy of the input and encodes it; raw literals replace their markers in the text. */
function encodeMutated(base: Record<string, unknown>, mutations: Mutation[]): string {
  const v = structuredClone(base) as Record<string | number, unknown>;
  const raws: [string, string][] = [];
  for (const [i, m] of mutations.entries()) {
    let parent: unknown = v;
    for (const k of m.path.slice(0, -1)) parent = parent && typeof parent === "object" ? (parent as Record<string | number, unknown>)[k] : undefined;
    if (!parent || typeof parent !== "object") continue; // an earlier mutation removed or replaced this branch
    const key = m.path[m.path.length - 1]!;
    const target = parent as Record<string | number, unknown>;
    if (m.op === "delete") {
      if (Array.isArray(target)) target.splice(Number(key), 1);
      else delete target[key];
    } else if (m.op === "set") target[key] = detached(m.value);
    else {
      const marker = `__raw_${i}__`;
      target[key] = marker;
      raws.push([JSON.stringify(marker), m.literal]);
    }
  }
  let text = JSON.stringify(v);
  for (const [marker, literal] of raws) text = text.split(marker).join(literal);
  return text;
}

/* Regression: a conductance that overflows double precision once made the sparse solver
 * throw (a 500). The schema now bounds cross-section (≥ 0.01 mm²) and length (≥ 0.1 mm). */
const TINY_CONDUCTOR_NETWORK = {
  mode: "dc",
  conductors: [{ id: "c", materialId: "cu-etp", area_m2: 1e-200 }],
  nodes: [{ id: "S" }, { id: "L" }],
  segments: [{ id: "s", from: "S", to: "L", conductor: "c", length_m: 1 }],
  supplies: [{ node: "S", voltage_V: 230 }],
  loads: [{ node: "L", current_A: 10 }],
};

/* ------------------------------------------------------------------ */
/* Properties                                                            */
/* ------------------------------------------------------------------ */

describe("fuzzing /api/v1/calc/{kind}: never a 500", () => {
  for (const kind of CALC_KIND_NAMES) {
    describe(kind, () => {
      it("any JSON value (fc.anything) is a 200 or a 400 with fields", async () => {
        await fc.assert(
          fc.asyncProperty(fc.anything({ maxDepth: 3, maxKeys: 6 }), async (value) => {
            const text = JSON.stringify(value);
            const r = await postRaw(kind, text);
            expectContract(kind, r, text);
          }),
          { numRuns: RUNS.anything },
        );
      });

      it("any object (fc.object), also with the kind's own keys, is a 200 or a 400 with fields", async () => {
        const keys = Object.keys(CALC_EXAMPLES[kind]);
        const withOwnKeys = fc.dictionary(fc.constantFrom(...keys), fc.oneof(edgeValue, fc.object({ maxDepth: 1 })), { maxKeys: keys.length });
        await fc.assert(
          fc.asyncProperty(fc.oneof(fc.object({ maxDepth: 2 }), withOwnKeys), async (value) => {
            const text = JSON.stringify(value);
            const r = await postRaw(kind, text);
            expectContract(kind, r, text);
          }),
          { numRuns: RUNS.object },
        );
      });

      it("raw bodies (not JSON, empty, scalars, prototype keys) are a 400 with fields", async () => {
        const bodies = fc.oneof(
          fc.string({ maxLength: 40 }),
          fc.constantFrom("", "null", "[]", '"text"', "1e999", "{", '{"__proto__":{"polluted":1}}', '{"constructor":{"prototype":{"polluted":1}}}'),
        );
        await fc.assert(
          fc.asyncProperty(bodies, async (text) => {
            const r = await postRaw(kind, text);
            expectContract(kind, r, text);
          }),
          { numRuns: RUNS.rawBody },
        );
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      });

      it("mutations of a valid input (edge values, wrong types, missing fields, raw JSON literals) are a 200 or a 400 with fields", async () => {
        const base = CALC_EXAMPLES[kind];
        await fc.assert(
          fc.asyncProperty(mutationArb(nodePaths(base)), async (mutations) => {
            const text = encodeMutated(base, mutations);
            const r = await postRaw(kind, text);
            expectContract(kind, r, text);
          }),
          { numRuns: RUNS.mutations },
        );
      });
    });
  }

  it("the unmutated examples pass (so the mutations start from valid inputs)", async () => {
    for (const kind of CALC_KIND_NAMES) expect((await postRaw(kind, JSON.stringify(CALC_EXAMPLES[kind]))).status, kind).toBe(200);
  });

  it("JSON-unsafe numbers are refused by name: 1e999 parses as Infinity and is not finite", async () => {
    const text = JSON.stringify(CALC_EXAMPLES["voltage-drop"]).replace('"length_m":180', '"length_m":1e999');
    const r = await postRaw("voltage-drop", text);
    expect(r.status).toBe(400);
    expect(r.json.error.fields.length_m).toMatch(/Route length must be a number from 0 to 100000 m/);
  });
});

describe("regressions found by fuzzing", () => {
  it("bus-network: a vanishing cross-section or length is a 400 naming the field, not a 500", async () => {
    const r1 = await postRaw("bus-network", JSON.stringify(TINY_CONDUCTOR_NETWORK));
    expect(r1.status).toBe(400);
    expect(r1.json.error.fields["conductors.0.area_m2"]).toMatch(/cross-section must be from 1e-8 to 0.1 m²/);
    const tinyLength = { ...TINY_CONDUCTOR_NETWORK, conductors: [{ id: "c", materialId: "cu-etp", area_m2: 1e-4 }], segments: [{ id: "s", from: "S", to: "L", conductor: "c", length_m: 1e-200 }] };
    const r2 = await postRaw("bus-network", JSON.stringify(tinyLength));
    expect(r2.status).toBe(400);
    expect(r2.json.error.fields["segments.0.length_m"]).toMatch(/length must be from 0.0001 to 10000 m/);
  });
});
