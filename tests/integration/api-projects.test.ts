import { createServer } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { registerBearerResolver, type Actor } from "@/lib/auth/guard";
import { resetEnvCache } from "@/lib/env";
import { GET as listRoute, POST as createRoute } from "@/app/api/v1/projects/route";
import { GET as getRoute, PATCH as patchRoute } from "@/app/api/v1/projects/[id]/route";
import { POST as archiveRoute } from "@/app/api/v1/projects/[id]/archive/route";
import { GET as healthRoute } from "@/app/api/health/route";
import { makeOrg, makeUser, resetDb } from "../support/db";

// The route handlers run for real (guard, validation, queries, JSON); only the credential
// lookup is a test double: bearer "t-<role>" or "t-outsider" maps to a test user.
const actors = new Map<string, Actor>();

function call<P extends Record<string, string>>(
  handler: (req: Request, ctx: { params: Promise<P> }) => Promise<Response>,
  opts: { token?: string; method?: string; path?: string; body?: unknown; params?: P } = {},
) {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (opts.token) headers.authorization = `Bearer ${opts.token}`;
  const req = new Request(`http://127.0.0.1${opts.path ?? "/api/v1/projects"}`, {
    method: opts.method ?? (opts.body === undefined ? "GET" : "POST"),
    headers,
    body: opts.body === undefined ? undefined : typeof opts.body === "string" ? opts.body : JSON.stringify(opts.body),
  });
  return handler(req, { params: Promise.resolve(opts.params ?? ({} as P)) });
}

/** A loopback port that was free a moment ago. */
function unusedPort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

const body = {
  code: "API-1",
  name: "Feeder pillar FP-2",
  client: "Marsh Lane Estates",
  site: "Gate house",
  systemVoltage: 400,
  systemType: "3ph-4w",
  frequency: 50,
  earthing: "TT",
  designAmbient: 30,
  altitude: 15,
  standardFamily: "iec",
  unitSystem: "metric",
  notes: "",
};

describe("JSON API: /api/v1/projects", () => {
  beforeAll(async () => {
    await resetDb();
    const org = await makeOrg("Fenwick Switchgear");
    const other = await makeOrg("Other Panels");
    for (const role of ["admin", "lead", "engineer", "viewer"] as const) {
      const u = await makeUser(org.id, role);
      actors.set(`t-${role}`, { id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });
    }
    const o = await makeUser(other.id, "admin");
    actors.set("t-outsider", { id: o.id, organisationId: o.organisationId, role: o.role, name: o.name, email: o.email });
    registerBearerResolver(async (token) => actors.get(token) ?? null);
  });
  afterAll(async () => {
    await closeDb();
  });

  let id = 0;

  it("creates (201), lists and reads a project", async () => {
    const created = await call(createRoute, { token: "t-engineer", body });
    expect(created.status).toBe(201);
    const { project } = (await created.json()) as { project: { id: number; version: number; code: string; designAmbientC: number } };
    expect(project).toMatchObject({ code: "API-1", version: 1, designAmbientC: 30 });
    id = project.id;

    const list = await call(listRoute, { token: "t-viewer", path: "/api/v1/projects?q=fp-2&sort=code&dir=asc" });
    expect(list.status).toBe(200);
    expect(((await list.json()) as { projects: { code: string }[] }).projects.map((p) => p.code)).toEqual(["API-1"]);

    const one = await call(getRoute, { token: "t-viewer", params: { id: String(id) } });
    expect(one.status).toBe(200);
  });

  it("answers 400 with field errors naming the field and range", async () => {
    const res = await call(createRoute, { token: "t-engineer", body: { ...body, code: "API-2", systemVoltage: 5 } });
    expect(res.status).toBe(400);
    const json = (await res.json()) as { error: { code: string; fields: Record<string, string> } };
    expect(json.error.code).toBe("validation");
    expect(json.error.fields.systemVoltage).toMatch(/^System voltage must be from 12 to 1000 V/);
    expect((await call(createRoute, { token: "t-engineer", body: "{not json" })).status).toBe(400);
    expect((await call(listRoute, { token: "t-viewer", path: "/api/v1/projects?sort=voltage" })).status).toBe(400);
    const dup = await call(createRoute, { token: "t-lead", body });
    expect(dup.status).toBe(400);
    expect(((await dup.json()) as { error: { fields: Record<string, string> } }).error.fields.code).toMatch(/already used/);
  });

  it("answers 401 for an unknown token, 403 for a viewer's write", async () => {
    expect((await call(createRoute, { token: "t-nobody", body })).status).toBe(401);
    expect((await call(createRoute, { token: "t-viewer", body: { ...body, code: "API-3" } })).status).toBe(403);
    expect((await call(archiveRoute, { token: "t-engineer", params: { id: String(id) }, body: { archived: true } })).status).toBe(403);
  });

  it("answers 404 for another organisation's project and for a malformed id", async () => {
    expect((await call(getRoute, { token: "t-outsider", params: { id: String(id) } })).status).toBe(404);
    expect((await call(patchRoute, { token: "t-outsider", method: "PATCH", params: { id: String(id) }, body: { version: 1, name: "x" } })).status).toBe(404);
    expect((await call(getRoute, { token: "t-viewer", params: { id: "abc" } })).status).toBe(404);
  });

  it("PATCH requires the version, merges the fields sent, and answers 409 when stale", async () => {
    const noVersion = await call(patchRoute, { token: "t-engineer", method: "PATCH", params: { id: String(id) }, body: { name: "No version" } });
    expect(noVersion.status).toBe(400);
    const ok = await call(patchRoute, { token: "t-engineer", method: "PATCH", params: { id: String(id) }, body: { version: 1, name: "Feeder pillar FP-2A" } });
    expect(ok.status).toBe(200);
    const { project } = (await ok.json()) as { project: { name: string; version: number; earthing: string } };
    expect(project).toMatchObject({ name: "Feeder pillar FP-2A", version: 2, earthing: "TT" });
    const stale = await call(patchRoute, { token: "t-lead", method: "PATCH", params: { id: String(id) }, body: { version: 1, name: "Stale" } });
    expect(stale.status).toBe(409);
    expect(((await stale.json()) as { error: { code: string } }).error.code).toBe("conflict");
  });

  it("PATCH converts stored values when only the unit system changes", async () => {
    const res = await call(patchRoute, { token: "t-engineer", method: "PATCH", params: { id: String(id) }, body: { version: 2, unitSystem: "imperial" } });
    expect(res.status).toBe(200);
    const { project } = (await res.json()) as { project: { designAmbient: number; designAmbientC: number; altitude: number } };
    expect(project.designAmbient).toBe(86); // 30 °C × 9/5 + 32
    expect(project.designAmbientC).toBeCloseTo(30, 9);
    expect(project.altitude).toBe(49); // 15 m / 0.3048 = 49.2 ft, shown to whole feet
  });

  it("archives through the API for a lead", async () => {
    const res = await call(archiveRoute, { token: "t-lead", params: { id: String(id) }, body: { archived: true } });
    expect(res.status).toBe(200);
    expect(((await res.json()) as { project: { archivedAt: string | null } }).project.archivedAt).not.toBeNull();
    const list = await call(listRoute, { token: "t-viewer" });
    expect(((await list.json()) as { projects: unknown[] }).projects).toEqual([]);
  });
});

describe("GET /api/health and the database being down", () => {
  it("reports 200 with database ok", async () => {
    const res = await healthRoute();
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ app: "ok", database: "ok", version: expect.any(String) });
  });

  it("reports 503 quickly, and the API answers 503, when the database cannot be reached", async () => {
    await closeDb();
    const saved = { url: process.env.DATABASE_URL, port: process.env.DB_PORT };
    delete process.env.DATABASE_URL;
    process.env.DB_PORT = String(await unusedPort()); // nothing listens there: connection refused
    resetEnvCache();
    try {
      const started = Date.now();
      const res = await healthRoute();
      expect(res.status).toBe(503);
      expect(await res.json()).toMatchObject({ app: "ok", database: "down" });
      expect(Date.now() - started).toBeLessThan(2500);
      const api = await call(listRoute, { token: "t-viewer" });
      expect(api.status).toBe(503);
      expect(((await api.json()) as { error: { message: string } }).error.message).toMatch(/database/i);
    } finally {
      await closeDb();
      if (saved.url === undefined) delete process.env.DATABASE_URL;
      else process.env.DATABASE_URL = saved.url;
      process.env.DB_PORT = saved.port;
      resetEnvCache();
    }
  });
});
