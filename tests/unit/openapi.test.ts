import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { describe, expect, it } from "vitest";
import { buildOpenApi, OPENAPI_FILE, renderOpenApi } from "@/scripts/openapi";
import { PERMISSIONS } from "@/lib/auth/roles";
import { CALC_KIND_NAMES } from "@/lib/engine";

// The committed API document must be what the generator produces now, and it must
// describe every route handler under app/api (methods included), with no dangling $ref.

const ROOT = new URL("../../", import.meta.url).pathname;
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

interface Doc {
  paths: Record<string, Record<string, { "x-permission"?: string; "x-roles"?: string[]; security?: unknown[]; responses: Record<string, unknown> }>>;
  components: { schemas: Record<string, unknown>; responses: Record<string, unknown> };
}

function routeFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...routeFiles(p));
    else if (/^route\.tsx?$/.test(name)) out.push(p);
  }
  return out;
}

/** app/api/v1/sheets/[id]/route.ts → /api/v1/sheets/{id} */
function urlOf(file: string): string {
  const rel = relative(join(ROOT, "app"), file).split(sep).slice(0, -1);
  return "/" + rel.filter((s) => !/^\(.*\)$/.test(s)).map((s) => s.replace(/^\[(.+)\]$/, "{$1}")).join("/");
}

function exportedMethods(file: string): string[] {
  const text = readFileSync(file, "utf8");
  return METHODS.filter((m) => new RegExp(`export\\s+(const\\s+${m}\\b|(async\\s+)?function\\s+${m}\\b)`).test(text));
}

describe("public/openapi.json", () => {
  const doc = buildOpenApi() as unknown as Doc;

  it("is up to date with the generator (run: npx tsx scripts/openapi.ts)", () => {
    expect(readFileSync(OPENAPI_FILE, "utf8")).toBe(renderOpenApi());
  });

  it("documents every route handler under app/api/v1 and the health check, method by method", () => {
    const files = [...routeFiles(join(ROOT, "app/api/v1")), join(ROOT, "app/api/health/route.ts")];
    expect(files.length).toBeGreaterThan(8);
    for (const file of files) {
      const url = urlOf(file);
      const methods = exportedMethods(file);
      expect(methods.length, file).toBeGreaterThan(0);
      expect(Object.keys(doc.paths), `${url} is not documented`).toContain(url);
      expect(Object.keys(doc.paths[url]!).map((m) => m.toUpperCase()).sort(), url).toEqual([...methods].sort());
    }
  });

  it("documents each calculation kind's body on its own path", () => {
    for (const k of CALC_KIND_NAMES) expect(doc.paths[`/api/v1/calc/${k}`]?.post, k).toBeDefined();
  });

  it("has no dangling $ref", () => {
    const refs = [...JSON.stringify(doc).matchAll(/"\$ref":"([^"]+)"/g)].map((m) => m[1]!);
    expect(refs.length).toBeGreaterThan(10);
    for (const r of new Set(refs)) {
      const m = /^#\/components\/(schemas|responses)\/(.+)$/.exec(r);
      expect(m, r).not.toBeNull();
      expect(doc.components[m![1] as "schemas" | "responses"][m![2]!], r).toBeDefined();
    }
  });

  it("states the permission and its roles on every signed-in operation, as roles.ts grants them", () => {
    for (const [url, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) {
        if (url === "/api/health") {
          expect(op.security).toEqual([]);
          continue;
        }
        const p = op["x-permission"] as keyof typeof PERMISSIONS | undefined;
        expect(p, `${method} ${url}`).toBeDefined();
        expect(op["x-roles"]).toEqual([...PERMISSIONS[p!]]);
        expect(op.responses["401"], `${method} ${url}`).toBeDefined();
      }
    }
  });
});
