import type { Endpoint } from "./model";
import { Prose } from "./prose";
import { SchemaFields } from "./schema-fields";

const METHOD_TONES: Record<string, string> = {
  GET: "bg-fen-100 text-fen-800",
  POST: "bg-copper-100 text-copper-900",
  PATCH: "bg-amberline-100 text-amberline-700",
  DELETE: "bg-signal-50 text-signal-700",
};

const AUTH_TEXT: Record<Endpoint["auth"], string> = {
  "bearer-or-session": "Bearer token or signed-in session",
  session: "Signed-in session only (a token cannot do this)",
  public: "No sign-in",
};

/** One operation: method, path, who may call it, parameters, body and answers. */
export function EndpointCard({ e, curl }: { e: Endpoint; curl: string }) {
  const params = e.op.parameters ?? [];
  return (
    <article id={e.id} aria-labelledby={`${e.id}-title`} className="panel scroll-mt-20 p-5">
      <h3 id={`${e.id}-title`} className="flex flex-wrap items-center gap-2 text-base font-semibold text-fen-900">
        <span className={`badge font-mono ${METHOD_TONES[e.method] ?? "bg-fen-100 text-fen-800"}`}>{e.method}</span>
        <code className="font-mono text-sm break-all">{e.path}</code>
      </h3>
      <p className="mt-1 text-sm text-fen-800">{e.op.summary}</p>
      {e.op.description ? <p className="mt-1 text-sm text-fen-600">
          <Prose text={e.op.description} />
        </p> : null}

      <dl className="mt-3 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[9rem_1fr]">
        <dt className="font-medium text-fen-700">Authentication</dt>
        <dd className="text-fen-800">{AUTH_TEXT[e.auth]}</dd>
        {e.op["x-roles"] ? (
          <>
            <dt className="font-medium text-fen-700">Roles</dt>
            <dd className="text-fen-800">
              {e.op["x-roles"].join(", ")} <span className="text-fen-500">({e.op["x-permission"]})</span>
            </dd>
          </>
        ) : null}
        <dt className="font-medium text-fen-700">Answers</dt>
        <dd>
          <ul>
            {e.statuses.map((s) => (
              <li key={s.status} className="text-fen-800">
                <span className="font-mono font-semibold">{s.status}</span> <Prose text={s.description} />
              </li>
            ))}
          </ul>
        </dd>
      </dl>

      {params.length ? (
        <div className="mt-3">
          <h4 className="text-sm font-semibold text-fen-800">Parameters</h4>
          <ul className="text-sm">
            {params.map((p) => (
              <li key={`${p.in}-${p.name}`} className="py-0.5">
                <code className="font-mono font-semibold">{p.name}</code> <span className="text-fen-500">({p.in})</span>
                {p.schema.enum ? <span className="text-fen-600"> one of: {p.schema.enum.map(String).join(", ")}</span> : null}
                {p.description ? <span className="text-fen-600"> — {p.description}</span> : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      {e.body ? (
        <details className="mt-3">
          <summary className="cursor-pointer text-sm font-semibold text-copper-800">Request body fields</summary>
          <div className="mt-2">
            <SchemaFields schema={e.body} />
          </div>
        </details>
      ) : null}

      <details className="mt-3">
        <summary className="cursor-pointer text-sm font-semibold text-copper-800">Example request</summary>
        <pre className="mt-2 overflow-x-auto rounded-md bg-fen-950 p-3 font-mono text-xs text-fen-50">{curl}</pre>
      </details>
    </article>
  );
}
