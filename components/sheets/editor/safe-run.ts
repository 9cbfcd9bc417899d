import type { z } from "zod";
import type { CalcResult } from "@/lib/engine/core/result";
import { EngineError } from "@/lib/engine/core/result";
import { fieldErrors } from "@/lib/engine/core/field-errors";

/** Outcome of a live run: the result, or field messages keyed by input path. */
export type LiveOutcome = { ok: true; result: CalcResult<unknown> } | { ok: false; fields: Record<string, string> };

/**
 * One kind's calculation run in the page, with the same contract as the engine
 * registry's `runCalc` (never throws for bad input). Used for the cheap kinds, whose
 * form module carries its own schema and function, so the browser loads only that
 * kind's part of the engine.
 */
export function safeRun<S extends z.ZodType>(schema: S, run: (input: z.output<S>) => CalcResult<unknown>, raw: unknown): LiveOutcome {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) return { ok: false, fields: fieldErrors(parsed.error) };
  try {
    return { ok: true, result: run(parsed.data) };
  } catch (err) {
    if (err instanceof EngineError) return { ok: false, fields: { [err.field ?? "_"]: err.message } };
    const zodLike = err as { issues?: unknown };
    if (zodLike && Array.isArray(zodLike.issues)) return { ok: false, fields: fieldErrors(err as z.ZodError) };
    return { ok: false, fields: { _: err instanceof Error ? err.message : "The calculation failed" } };
  }
}
