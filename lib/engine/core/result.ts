/**
 * The shape every Ohmstead calculation returns. The PDF prints the method from
 * `formulas` and `intermediates`; the sheet shows `checks` as pass/fail badges.
 */
export const ENGINE_VERSION = "1.0.0";

/** A formula as printed in the method section, with where it comes from. */
export interface Formula {
  id: string;
  /** Readable mathematical notation, e.g. "R_θ = R_20·(β + θ)/(β + 20)". */
  expression: string;
  /** Standard and clause, or handbook and section; "common practice" where that is the truth. */
  source: string;
}

/** A named intermediate or result quantity in SI (or the trade's usual unit, stated). */
export interface Quantity {
  label: string;
  value: number;
  unit: string;
}

/** A pass/fail check of a computed value against a limit. */
export interface Check {
  id: string;
  label: string;
  value: number;
  limit: number;
  unit: string;
  /** "max": passes when value ≤ limit; "min": passes when value ≥ limit. */
  kind: "max" | "min";
  pass: boolean;
  /** (limit − value)/limit for "max", (value − limit)/limit for "min". Positive = spare. */
  margin: number;
}

export interface Warning {
  code: string;
  message: string;
}

export interface CalcResult<R> {
  kind: string;
  engineVersion: string;
  results: R;
  intermediates: Record<string, Quantity>;
  formulas: Formula[];
  warnings: Warning[];
  checks: Check[];
}

export function check(
  id: string,
  label: string,
  value: number,
  limit: number,
  unit: string,
  kind: "max" | "min" = "max",
): Check {
  const pass = kind === "max" ? value <= limit : value >= limit;
  const margin = limit === 0 ? (pass ? 0 : -Infinity) : kind === "max" ? (limit - value) / limit : (value - limit) / limit;
  return { id, label, value, limit, unit, kind, pass, margin };
}

export function q(label: string, value: number, unit: string): Quantity {
  return { label, value, unit };
}

/** Thrown by the engine for inputs that are valid field by field but cannot be computed together. */
export class EngineError extends Error {
  constructor(
    public readonly code: string,
    message: string,
    public readonly field?: string,
  ) {
    super(message);
    this.name = "EngineError";
  }
}
