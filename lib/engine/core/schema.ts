import { z } from "zod";

/**
 * A finite number field with a range, named in its messages. Numbers may arrive as
 * strings from forms and query strings: a non-empty numeric string is accepted, an
 * empty one is "required", and anything else names the field and the allowed range.
 */
export function num(label: string, unit: string, min: number, max: number, opts: { exclusiveMin?: boolean } = {}) {
  const range = `${opts.exclusiveMin ? "greater than" : "from"} ${min}${opts.exclusiveMin ? ` and up to` : " to"} ${max}${unit ? ` ${unit}` : ""}`;
  return z.preprocess(
    (v) => {
      if (typeof v === "string") {
        const t = v.trim().replace(/\s+/g, "");
        if (t === "") return undefined;
        return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
      }
      return v;
    },
    z
      .number({ error: (iss) => (iss.input === undefined ? `${label} is required (${range})` : `${label} must be a number ${range}`) })
      .refine((n) => Number.isFinite(n), { message: `${label} must be a finite number ${range}` })
      .refine((n) => (opts.exclusiveMin ? n > min : n >= min) && n <= max, { message: `${label} must be ${range}` }),
  ) as unknown as z.ZodType<number, unknown>;
}

/** Whole number with a range. */
export function int(label: string, min: number, max: number) {
  return num(label, "", min, max).refine((n) => Number.isInteger(n), { message: `${label} must be a whole number from ${min} to ${max}` });
}

/** A choice from a closed set, with a message listing the allowed values. */
export function choice<const T extends readonly [string, ...string[]]>(label: string, values: T) {
  return z.enum(values, { error: () => `${label} must be one of: ${values.join(", ")}` });
}

export { fieldErrors } from "./field-errors";
