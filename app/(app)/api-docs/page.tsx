import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { env } from "@/lib/env";
import { EndpointCard } from "./endpoint-card";
import { Prose } from "./prose";
import { API_DOC, endpointsByTag, errorCodes, type Endpoint } from "./model";

export const metadata: Metadata = { title: "API" };

/** A shell-quoted curl command for an endpoint, with its documented example body. */
function curlFor(base: string, e: Endpoint): string {
  const path = e.path.replace("{id}", "42").replace("{ordinal}", "0").replace("{kind}", "voltage-drop");
  const lines = [`curl -X ${e.method} "${base}${path}"`];
  if (e.auth === "bearer-or-session") lines.push(`  -H "Authorization: Bearer $OHMSTEAD_TOKEN"`);
  if (e.auth === "session") lines.push(`  # only from a signed-in browser session: API tokens are refused here`);
  if (e.example !== undefined) {
    lines.push(`  -H "Content-Type: application/json"`);
    lines.push(`  -d '${JSON.stringify(e.example).replace(/'/g, "'\\''")}'`);
  }
  return lines.join(" \\\n");
}

export default async function ApiDocsPage() {
  await requirePageActor("sheet.read");
  const base = env().APP_URL.replace(/\/$/, "");
  const groups = endpointsByTag();
  const errors = errorCodes();
  const example = groups.flatMap((g) => g.endpoints).find((e) => e.id === "runCalc_voltage_drop");

  return (
    <div className="space-y-8">
      <PageHeader eyebrow={`Version ${API_DOC.info.version}`} title="Ohmstead API" description="Projects, calculation sheets and stateless calculations for your own scripts and programs. Every request and answer is JSON." />

      <div role="note" className="rounded-md border border-amberline-500/40 bg-amberline-50 px-4 py-3 text-sm text-fen-800">
        Calculation results are design aids. Verification per the governing standard, local codes and a qualified engineer decide whether a design is safe.
      </div>

      <section aria-labelledby="auth-heading" className="panel space-y-3 p-5">
        <h2 id="auth-heading" className="text-base font-semibold text-fen-900">
          Authentication
        </h2>
        <p className="text-sm text-fen-700">
          Create a personal token under <Link href="/account/tokens" className="font-medium text-copper-700 underline underline-offset-2">API tokens</Link> and send it in the{" "}
          <code className="font-mono">Authorization</code> header. A token acts as you: your role decides what it may do and it sees only your organisation. Tokens cannot
          create or revoke tokens. Revoke a token the moment it may have leaked.
        </p>
        {example ? (
          <>
            <p className="text-sm text-fen-700">For example, a voltage-drop calculation (SI units; nothing is stored):</p>
            <pre className="overflow-x-auto rounded-md bg-fen-950 p-3 font-mono text-xs text-fen-50">{curlFor(base, example)}</pre>
          </>
        ) : null}
        <p className="text-sm text-fen-700">
          Saves and transitions send back the sheet&apos;s <code className="font-mono">version</code> from the last read. If someone saved in between, the answer is{" "}
          <strong>409</strong> and nothing is overwritten: read again, merge, retry.
        </p>
        <p className="text-sm text-fen-700">
          The machine-readable description is at{" "}
          <a href="/openapi.json" className="font-medium text-copper-700 underline underline-offset-2">
            /openapi.json
          </a>{" "}
          (OpenAPI 3.1).
        </p>
      </section>

      <section aria-labelledby="errors-heading" className="panel overflow-x-auto">
        <h2 id="errors-heading" className="px-5 pt-5 pb-1 text-base font-semibold text-fen-900">
          Errors
        </h2>
        <p className="px-5 pb-3 text-sm text-fen-600">
          Every error has the same shape: <code className="font-mono">{`{ "error": { "code", "message", "fields"? } }`}</code>. Another organisation&apos;s ids answer 404, as if they did not exist.
        </p>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Status</th>
              <th scope="col">Code</th>
              <th scope="col">Meaning</th>
            </tr>
          </thead>
          <tbody>
            {errors.map((e) => (
              <tr key={e.name}>
                <td className="font-mono font-semibold">{e.status}</td>
                <td>
                  <code className="font-mono">{e.code}</code>
                </td>
                <td>
                  <Prose text={e.description} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <nav aria-label="Endpoints" className="panel p-5">
        <h2 className="mb-2 text-base font-semibold text-fen-900">Endpoints</h2>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {groups.map((g) => (
            <div key={g.tag}>
              <h3 className="text-sm font-semibold text-fen-800">{g.tag}</h3>
              <ul className="mt-1 space-y-0.5">
                {g.endpoints.map((e) => (
                  <li key={e.id} className="text-sm">
                    <a href={`#${e.id}`} className="text-copper-800 hover:underline">
                      <span className="font-mono text-xs">{e.method}</span> {e.path}
                    </a>
                  </li>
                ))}
              </ul>
            </div>
          ))}
        </div>
      </nav>

      {groups.map((g) => (
        <section key={g.tag} aria-labelledby={`tag-${g.tag.toLowerCase().replace(/[^a-z0-9]+/g, "-")}`} className="space-y-4">
          <div>
            <h2 id={`tag-${g.tag.toLowerCase().replace(/[^a-z0-9]+/g, "-")}`} className="text-lg font-semibold text-fen-950">
              {g.tag}
            </h2>
            <p className="text-sm text-fen-600">{g.description}</p>
          </div>
          {g.endpoints.map((e) => (
            <EndpointCard key={e.id} e={e} curl={curlFor(base, e)} />
          ))}
        </section>
      ))}
    </div>
  );
}
