import { createHash } from "node:crypto";

/** JSON with object keys sorted at every level, so equal content gives equal bytes. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) =>
    v && typeof v === "object" && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

export function sha256Hex(data: string | Buffer | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

/** The content hash stored with a revision: inputs, results and the engine version. */
export function contentHash(inputs: unknown, results: unknown, engineVersion: string): string {
  return sha256Hex(canonicalJson({ engineVersion, inputs, results }));
}
