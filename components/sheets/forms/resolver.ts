import { zodResolver } from "@hookform/resolvers/zod";
import type { FieldErrors, FieldValues, Resolver } from "react-hook-form";
import type { z } from "zod";
import { localiseMessage, toEngineInputs, type UnitSystem } from "@/lib/sheets/units";

/**
 * The thin adapter between a sheet form and the engine's own zod schema: the form's
 * strings (in the project's units) are converted to SI, checked by zodResolver with the
 * engine schema, and any message's range is put back into the user's units. The form
 * keeps its own values; the engine inputs are derived again when they are needed.
 */
export function engineResolver(schema: z.ZodType, kind: string, system: UnitSystem): Resolver<FieldValues> {
  const inner = zodResolver(schema as unknown as z.ZodType<FieldValues, FieldValues>, undefined, { raw: true }) as Resolver<FieldValues>;
  return async (values, context, options) => {
    const si = toEngineInputs(kind, values, system);
    const r = await inner(si, context, options);
    const errors = localiseErrors(r.errors, "", kind, system);
    return Object.keys(errors).length > 0 ? { values: {}, errors } : { values, errors: {} };
  };
}

function localiseErrors(node: FieldErrors, path: string, kind: string, system: UnitSystem): FieldErrors {
  const out = (Array.isArray(node) ? [] : {}) as Record<string, unknown>;
  for (const [k, v] of Object.entries(node as Record<string, unknown>)) {
    if (!v || typeof v !== "object") continue;
    const p = path ? `${path}.${k}` : k;
    const e = v as { message?: unknown; type?: unknown };
    if (typeof e.message === "string" && typeof e.type === "string") {
      out[k] = { ...e, message: localiseMessage(kind, p, e.message, system) };
    } else if (k !== "ref") {
      out[k] = localiseErrors(v as FieldErrors, p, kind, system);
    }
  }
  return out as FieldErrors;
}
