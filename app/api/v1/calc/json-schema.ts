import { z } from "zod";
import { CALC_KINDS, type CalcKindName } from "@/lib/engine";

const cache = new Map<CalcKindName, Record<string, unknown>>();

/**
 * The JSON Schema (draft 2020-12) of a kind's request body, generated from the engine's
 * own zod schema, so the API document cannot drift from what the server accepts.
 * Ranges live in refinements and are not expressible here; the 400 messages state them.
 */
export function calcInputJsonSchema(kind: CalcKindName): Record<string, unknown> {
  let s = cache.get(kind);
  if (!s) {
    const { $schema: _ignored, ...rest } = z.toJSONSchema(CALC_KINDS[kind].schema, { io: "input", unrepresentable: "any" }) as Record<string, unknown>;
    s = rest;
    cache.set(kind, s);
  }
  return s;
}
