import { resolve, typeLabel, type JsonSchema } from "./model";
import { Prose } from "./prose";

/**
 * The fields of a request body as a nested list: name, type, whether required, default.
 * Alternatives (oneOf) are listed one after the other.
 */
export function SchemaFields({ schema, depth = 0 }: { schema: JsonSchema; depth?: number }) {
  const s = resolve(schema) ?? schema;
  if (s.oneOf || s.anyOf) {
    const alternatives = (s.oneOf ?? s.anyOf)!.map((x) => resolve(x) ?? x).filter((x) => x.properties);
    if (alternatives.length === 0) return null;
    return (
      <ol className="space-y-2">
        {alternatives.map((alt, i) => (
          <li key={i}>
            <p className="text-xs font-semibold uppercase tracking-wide text-fen-500">Form {i + 1}</p>
            <SchemaFields schema={alt} depth={depth} />
          </li>
        ))}
      </ol>
    );
  }
  const item = s.type === "array" ? resolve(s.items) : undefined;
  const target = item?.properties ? item : s;
  if (!target.properties || depth > 4) return null;
  const required = new Set(target.required ?? []);
  return (
    <ul className={depth ? "mt-1 border-l border-fen-200 pl-4" : ""}>
      {Object.entries(target.properties).map(([name, p]) => {
        const r = resolve(p) ?? p;
        const nested = r.properties || r.oneOf || (r.type === "array" && resolve(r.items)?.properties);
        return (
          <li key={name} className="py-1 text-sm">
            <code className="font-mono font-semibold text-fen-900">{name}</code> <span className="text-fen-600">{nested ? (r.type === "array" ? "array of objects" : "object") : typeLabel(r)}</span>
            {required.has(name) ? <span className="ml-2 badge bg-copper-50 text-copper-800">required</span> : null}
            {r.default !== undefined ? <span className="ml-2 text-xs text-fen-500">default {JSON.stringify(r.default)}</span> : null}
            {r.description ? (
              <p className="text-xs text-fen-600">
                <Prose text={r.description} />
              </p>
            ) : null}
            {nested ? <SchemaFields schema={r} depth={depth + 1} /> : null}
          </li>
        );
      })}
    </ul>
  );
}
