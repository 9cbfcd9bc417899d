import { validationError } from "@/lib/errors";

/** Largest calculation request accepted, bytes (an organisation ampacity table fits easily). */
export const MAX_CALC_BODY_BYTES = 1024 * 1024;

/**
 * Reads a JSON body without a schema (the engine's schema decides): 400 naming the body
 * when it is not JSON or too large. `runCalc` then names the fields.
 */
export async function readRawJson(req: Request): Promise<unknown> {
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > MAX_CALC_BODY_BYTES) throw tooLarge();
  let text: string;
  try {
    text = await req.text();
  } catch {
    throw validationError({ _: "The request body could not be read" }, "The request body could not be read");
  }
  if (Buffer.byteLength(text, "utf8") > MAX_CALC_BODY_BYTES) throw tooLarge();
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw validationError({ _: "The request body must be JSON" }, "The request body must be JSON");
  }
}

function tooLarge() {
  const msg = `The request body must be at most ${MAX_CALC_BODY_BYTES / 1024} KB of JSON`;
  return validationError({ _: msg }, msg);
}
