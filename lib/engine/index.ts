/**
 * The engine's calculation kinds: one zod input schema and one pure function each.
 * Forms, server actions, the JSON API, the CLI and the web worker all go through here.
 */
import type { z } from "zod";
import { fieldErrors } from "./core/schema";
import { EngineError, ENGINE_VERSION, type CalcResult } from "./core/result";
import { calcResistance, resistanceInputSchema } from "./resistance";
import { calcFaultWithstand, faultWithstandSchema } from "./short-circuit";
import { calcEnclosureHeat, enclosureHeatSchema } from "./enclosure-heat";
import { calcBusbarRating, busbarRatingSchema } from "./busbar-thermal";
import { calcBusbarSizing, busbarSizingSchema } from "./busbar-sizing";
import { voltageDrop, voltageDropInputSchema } from "./voltage-drop";
import { cableAmpacity, cableAmpacityInputSchema } from "./cable-ampacity";
import { ampacityFromTable, ampacityLookupInputSchema } from "./ampacity-table";
import { cableSizing, cableSizingInputSchema } from "./cable-sizing";
import { parallelSharing, parallelSharingInputSchema } from "./parallel";
import { networkInputErrors, networkInputSchema, solveNetwork } from "./network";

export { ENGINE_VERSION };
export type { CalcResult };

export interface CalcKind {
  kind: string;
  title: string;
  schema: z.ZodType;
  run: (input: never) => CalcResult<unknown>;
  /**
   * Optional fast validation for kinds with bulk inputs: returns the same field messages
   * as the schema, or null when the input is valid (then `run` receives the raw input).
   */
  fastErrors?: (raw: unknown) => Record<string, string> | null;
}

function kind<S extends z.ZodType>(
  kind: string,
  title: string,
  schema: S,
  run: (input: z.output<S>) => CalcResult<unknown>,
  fastErrors?: (raw: unknown) => Record<string, string> | null,
): CalcKind {
  return { kind, title, schema, run: run as (input: never) => CalcResult<unknown>, ...(fastErrors ? { fastErrors } : {}) };
}

export const CALC_KINDS = {
  resistance: kind("resistance", "Conductor resistance, DC and AC", resistanceInputSchema, (i) => calcResistance(i)),
  "busbar-rating": kind("busbar-rating", "Busbar temperature and rating (heat balance)", busbarRatingSchema, (i) => calcBusbarRating(i as never)),
  "busbar-sizing": kind("busbar-sizing", "Busbar sizing: standard arrangements that pass", busbarSizingSchema, (i) => calcBusbarSizing(i as never)),
  "voltage-drop": kind("voltage-drop", "Feeder voltage drop", voltageDropInputSchema, (i) => voltageDrop(i as never)),
  "cable-ampacity": kind("cable-ampacity", "Cable ampacity in free air (IEC 60287)", cableAmpacityInputSchema, (i) => cableAmpacity(i as never)),
  "ampacity-table": kind("ampacity-table", "Ampacity from an organisation table with corrections", ampacityLookupInputSchema, (i) => ampacityFromTable(i as never)),
  "cable-sizing": kind("cable-sizing", "Cable sizing: smallest size and number in parallel", cableSizingInputSchema, (i) => cableSizing(i as never)),
  "parallel-sharing": kind("parallel-sharing", "Current sharing between parallel paths", parallelSharingInputSchema, (i) => parallelSharing(i as never)),
  // A network of 10⁵ nodes validates in a hand-written pass that gives the schema's own messages.
  "bus-network": kind("bus-network", "Bus network: nodal analysis of a panel's distribution", networkInputSchema, (i) => solveNetwork(i as never), networkInputErrors),
  "fault-withstand": kind("fault-withstand", "Short-circuit withstand, thermal and mechanical", faultWithstandSchema, (i) => calcFaultWithstand(i as never)),
  "enclosure-heat": kind("enclosure-heat", "Enclosure heat budget", enclosureHeatSchema, (i) => calcEnclosureHeat(i as never)),
} as const satisfies Record<string, CalcKind>;

export type CalcKindName = keyof typeof CALC_KINDS;
export const CALC_KIND_NAMES = Object.keys(CALC_KINDS) as CalcKindName[];

export function isCalcKind(k: string): k is CalcKindName {
  return Object.prototype.hasOwnProperty.call(CALC_KINDS, k);
}

export type RunOutcome = { ok: true; result: CalcResult<unknown> } | { ok: false; fields: Record<string, string> };

/** Validates and runs one calculation. Never throws for bad input: field messages come back instead. */
export function runCalc(kindName: string, raw: unknown): RunOutcome {
  if (!isCalcKind(kindName)) return { ok: false, fields: { kind: `Unknown calculation kind "${kindName}"; known: ${CALC_KIND_NAMES.join(", ")}` } };
  const k: CalcKind = CALC_KINDS[kindName];
  let input: unknown;
  if (k.fastErrors) {
    const fields = k.fastErrors(raw);
    if (fields) return { ok: false, fields };
    input = raw;
  } else {
    const parsed = k.schema.safeParse(raw);
    if (!parsed.success) return { ok: false, fields: fieldErrors(parsed.error) };
    input = parsed.data;
  }
  try {
    return { ok: true, result: k.run(input as never) };
  } catch (err) {
    if (err instanceof EngineError) return { ok: false, fields: { [err.field ?? "_"]: err.message } };
    const zodLike = err as { issues?: unknown };
    if (zodLike && Array.isArray(zodLike.issues)) return { ok: false, fields: fieldErrors(err as z.ZodError) };
    throw err;
  }
}
