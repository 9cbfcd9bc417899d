import type { z } from "zod";

/**
 * Field messages keyed by input path ("arrangement.barWidth_m"), the first message of
 * each path. Kept apart from schema.ts so code that only reads messages (the sheet
 * editor) does not load zod itself.
 */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "_";
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}
