/**
 * A pure deep diff over JSON values, reporting each changed leaf with its path.
 * Paths use the same dotted form as form field errors ("losses.2.loss_W"), so a
 * change can be shown beside the field it belongs to. The root itself has path "".
 * Paths are unambiguous as long as object keys are non-empty and contain no dot, which
 * holds for every calculation input and result field.
 */

/** One difference between two JSON values. */
export interface JsonChange {
  /** Dotted path ("a.b.0.c"); "" for the root value. */
  path: string;
  /** added: only in the newer value; removed: only in the older one; changed: in both, different. */
  kind: "added" | "removed" | "changed";
  /** The older value (absent for "added"). */
  from?: unknown;
  /** The newer value (absent for "removed"). */
  to?: unknown;
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

const join = (base: string, key: string | number) => (base === "" ? String(key) : `${base}.${key}`);

/** Equality of two JSON leaves; NaN equals NaN (both serialise to null anyway). */
function sameLeaf(a: unknown, b: unknown): boolean {
  if (typeof a === "number" && typeof b === "number") return a === b || (Number.isNaN(a) && Number.isNaN(b));
  return a === b;
}

/**
 * Every difference between `older` and `newer`, depth first, object keys in sorted
 * order. Objects are compared key by key and arrays index by index; a key whose value
 * is `undefined` counts as absent (JSON semantics). A change of type (object ↔ array ↔
 * leaf) is one "changed" entry at that path.
 */
export function diffJson(older: unknown, newer: unknown, base = ""): JsonChange[] {
  const out: JsonChange[] = [];
  walk(older, newer, base, out);
  return out;
}

function walk(a: unknown, b: unknown, path: string, out: JsonChange[]) {
  if (a === undefined && b === undefined) return;
  if (a === undefined) {
    out.push({ path, kind: "added", to: b });
    return;
  }
  if (b === undefined) {
    out.push({ path, kind: "removed", from: a });
    return;
  }
  if (isPlainObject(a) && isPlainObject(b)) {
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
    for (const k of keys) walk(a[k], b[k], join(path, k), out);
    return;
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    const n = Math.max(a.length, b.length);
    for (let i = 0; i < n; i++) walk(i < a.length ? a[i] : undefined, i < b.length ? b[i] : undefined, join(path, i), out);
    return;
  }
  if (isPlainObject(a) || isPlainObject(b) || Array.isArray(a) || Array.isArray(b)) {
    out.push({ path, kind: "changed", from: a, to: b });
    return;
  }
  if (!sameLeaf(a, b)) out.push({ path, kind: "changed", from: a, to: b });
}
