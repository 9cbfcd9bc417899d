import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { closeDb } from "@/db/client";
import { createProject } from "@/db/queries/projects";
import { GET as listSheetsRoute, POST as createSheetRoute } from "@/app/api/v1/projects/[id]/sheets/route";
import { GET as getSheetRoute, PATCH as saveSheetRoute } from "@/app/api/v1/sheets/[id]/route";
import { GET as getRevisionRoute } from "@/app/api/v1/sheets/[id]/revisions/[ordinal]/route";
import { POST as transitionRoute } from "@/app/api/v1/sheets/[id]/transitions/route";
import { GET as listTokensRoute, POST as createTokenRoute } from "@/app/api/v1/tokens/route";
import { DELETE as revokeTokenRoute } from "@/app/api/v1/tokens/[id]/route";
import { GET as calcKindsRoute } from "@/app/api/v1/calc/route";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import { listTokens, revokeToken } from "@/lib/auth/tokens";
import { ENGINE_VERSION } from "@/lib/engine";
import { projectSchema } from "@/lib/validation/project";
import { actorOf, call, tokenFor, type Handler } from "../support/api";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// The sheets JSON API end to end through the real handlers, guard, services and test
// database, authenticated with real API tokens. The token routes are session-only, so
// next-auth's session lookup is replaced by one that returns the user set in `session`.
const session = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("next-auth", async (importOriginal) => {
  const original = await importOriginal<typeof import("next-auth")>();
  return { ...original, getServerSession: async () => (session.userId ? { user: { id: session.userId } } : null) };
});

const T: Record<"engineer" | "engineer2" | "lead" | "viewer" | "outsider", string> = { engineer: "", engineer2: "", lead: "", viewer: "", outsider: "" };
let engineer: TestUser;
let projectId = 0;
let outsiderProjectId = 0;

const projectBody = (code: string) =>
  projectSchema.parse({
    code,
    name: "Pump house MCC",
    client: "Harrowgate Water Board",
    site: "North intake",
    systemVoltage: 400,
    systemType: "3ph-4w",
    frequency: 50,
    earthing: "TN-S",
    designAmbient: 35,
    altitude: 120,
    standardFamily: "iec",
    unitSystem: "metric",
  });

const vd = CALC_EXAMPLES["voltage-drop"];

function req<P extends Record<string, string>>(handler: Handler<P>, token: string | undefined, params: P, body?: unknown, method?: string) {
  return call(handler, { token, params, body, method, path: "/api/v1/test" });
}
const list = (token: string, pid = projectId) => req(listSheetsRoute, token, { id: String(pid) });
const create = (token: string, body: unknown, pid = projectId) => req(createSheetRoute, token, { id: String(pid) }, body);
const get = (token: string, id: number | string) => req(getSheetRoute, token, { id: String(id) });
const save = (token: string, id: number | string, body: unknown) => req(saveSheetRoute, token, { id: String(id) }, body, "PATCH");
const revision = (token: string, id: number | string, ordinal: number | string) => req(getRevisionRoute, token, { id: String(id), ordinal: String(ordinal) });
const transition = (token: string, id: number | string, body: unknown) => req(transitionRoute, token, { id: String(id) }, body);

beforeAll(async () => {
  const org = await makeOrg("Sheet Street Switchboards");
  const other = await makeOrg("Far Field Controls");
  engineer = await makeUser(org.id, "engineer");
  const engineer2 = await makeUser(org.id, "engineer");
  const lead = await makeUser(org.id, "lead");
  const viewer = await makeUser(org.id, "viewer");
  const outsider = await makeUser(other.id, "lead");
  T.engineer = await tokenFor(engineer);
  T.engineer2 = await tokenFor(engineer2);
  T.lead = await tokenFor(lead);
  T.viewer = await tokenFor(viewer);
  T.outsider = await tokenFor(outsider);
  const suffix = Date.now().toString(36).slice(-5);
  projectId = (await createProject(actorOf(lead), projectBody(`API-S-${suffix}`))).id;
  outsiderProjectId = (await createProject(actorOf(outsider), projectBody(`FAR-${suffix}`))).id;
});

afterAll(async () => {
  await closeDb();
});

describe("sheets through the JSON API with a bearer token", () => {
  let sheetId = 0;

  it("creates a sheet (201): version 1, draft revision A with server-computed results", async () => {
    const r = await create(T.engineer, { kind: "voltage-drop", tag: "VD-01", title: "Feeder to pump P-3", inputs: vd });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    const s = r.json.sheet;
    sheetId = s.id;
    expect(r.headers.get("location")).toBe(`/api/v1/sheets/${s.id}`);
    expect(s).toMatchObject({ projectId, kind: "voltage-drop", tag: "VD-01", title: "Feeder to pump P-3", version: 1, approvedLabel: null });
    expect(s.latest).toMatchObject({ ordinal: 0, label: "A", status: "draft", inputs: vd, inputErrors: null, engineVersion: ENGINE_VERSION });
    expect(s.latest.results.kind).toBe("voltage-drop");
    expect(s.latest.author.id).toBe(engineer.id);
    expect(r.json.inputErrors).toBeNull();
  });

  it("keeps a draft whose inputs are invalid, with the field errors and no results", async () => {
    const r = await create(T.engineer, { kind: "enclosure-heat", tag: "EH-01", title: "Heat budget, section 2", inputs: { width_m: 0.8, height_m: 9, depth_m: "deep" } });
    expect(r.status).toBe(201);
    expect(r.json.sheet.latest.results).toBeNull();
    expect(r.json.inputErrors.height_m).toMatch(/Enclosure height must be from 0.05 to 5 m/);
    expect(r.json.inputErrors.depth_m).toMatch(/Enclosure depth must be a number/);
    expect(r.json.sheet.latest.inputErrors).toEqual(r.json.inputErrors);
  });

  it("bad create bodies are 400 with the fields named", async () => {
    const r = await create(T.engineer, { kind: "perpetual-motion", tag: "", inputs: [] });
    expect(r.status).toBe(400);
    expect(r.json.error.code).toBe("validation");
    expect(r.json.error.fields.kind).toMatch(/Kind must be one of: .*voltage-drop/);
    expect(r.json.error.fields.tag).toMatch(/Tag is required/);
    expect(r.json.error.fields.title).toMatch(/Title is required/);
    expect(r.json.error.fields.inputs).toMatch(/Inputs must be an object/);
    const dup = await create(T.engineer, { kind: "voltage-drop", tag: "VD-01", title: "Second", inputs: vd });
    expect(dup.status).toBe(400);
    expect(dup.json.error.fields.tag).toMatch(/already used/);
    const notJson = await create(T.engineer, "{tag:");
    expect(notJson.status).toBe(400);
    expect(notJson.json.error.fields._).toMatch(/must be JSON/);
  });

  it("lists the project's sheets with their latest revision", async () => {
    const r = await list(T.viewer);
    expect(r.status).toBe(200);
    expect(r.json.sheets.map((s: { tag: string }) => s.tag)).toEqual(["VD-01", "EH-01"]);
    expect(r.json.sheets[0]).toMatchObject({ id: sheetId, version: 1, revision: { ordinal: 0, label: "A", status: "draft" }, author: { id: engineer.id } });
  });

  it("reads a sheet with its revisions", async () => {
    const r = await get(T.viewer, sheetId);
    expect(r.status).toBe(200);
    expect(r.json.sheet.revisions).toHaveLength(1);
    expect(r.json.sheet.revisions[0]).toMatchObject({ ordinal: 0, label: "A", status: "draft" });
    expect(r.json.sheet.revisions[0].inputs).toBeUndefined();
  });

  it("saves against the version read; a stale version is 409 and writes nothing", async () => {
    const ok = await save(T.engineer, sheetId, { version: 1, inputs: { ...vd, length_m: 210 }, title: "Feeder to pump P-3 (rerouted)" });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    expect(ok.json.sheet).toMatchObject({ version: 2, title: "Feeder to pump P-3 (rerouted)" });
    expect(ok.json.sheet.latest.inputs.length_m).toBe(210);
    expect(ok.json.newRevision).toBe(false);

    const stale = await save(T.engineer, sheetId, { version: 1, inputs: { ...vd, length_m: 999 } });
    expect(stale.status).toBe(409);
    expect(stale.json.error.code).toBe("conflict");
    const after = await get(T.engineer, sheetId);
    expect(after.json.sheet.version).toBe(2);
    expect(after.json.sheet.latest.inputs.length_m).toBe(210);
  });

  it("bad save bodies are 400 naming version and inputs", async () => {
    const r = await save(T.engineer, sheetId, { inputs: "lots" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.version).toMatch(/Version must be a whole number/);
    expect(r.json.error.fields.inputs).toMatch(/Inputs must be an object/);
  });

  it("another engineer may not edit the author's draft (403)", async () => {
    const r = await save(T.engineer2, sheetId, { version: 2, inputs: vd });
    expect(r.status).toBe(403);
  });

  it("submits, refuses a stale or comment-less transition, and approves; the approved revision is locked", async () => {
    const missing = await transition(T.engineer, sheetId, { version: 2 });
    expect(missing.status).toBe(400);
    expect(missing.json.error.fields.transition).toMatch(/Transition must be one of: submit, withdraw, approve, return/);

    const submitted = await transition(T.engineer, sheetId, { transition: "submit", version: 2 });
    expect(submitted.status, JSON.stringify(submitted.json)).toBe(200);
    expect(submitted.json.sheet).toMatchObject({ version: 3, latest: { status: "in_review" } });

    const stale = await transition(T.lead, sheetId, { transition: "approve", version: 2 });
    expect(stale.status).toBe(409);

    const noComment = await transition(T.lead, sheetId, { transition: "return", version: 3, comment: "  " });
    expect(noComment.status).toBe(400);
    expect(noComment.json.error.fields.comment).toMatch(/comment is required/);

    const approved = await transition(T.lead, sheetId, { transition: "approve", version: 3 });
    expect(approved.status).toBe(200);
    expect(approved.json.sheet).toMatchObject({ version: 4, approvedLabel: "A", latest: { status: "approved", label: "A" } });
    expect(approved.json.superseded).toEqual([]);

    const again = await transition(T.lead, sheetId, { transition: "approve", version: 4 });
    expect(again.status).toBe(409);
  });

  it("saving an approved sheet starts revision B; each revision reads back with its own inputs", async () => {
    const r = await save(T.engineer, sheetId, { version: 4, inputs: { ...vd, length_m: 240 } });
    expect(r.status).toBe(200);
    expect(r.json.newRevision).toBe(true);
    expect(r.json.sheet.latest).toMatchObject({ ordinal: 1, label: "B", status: "draft" });
    expect(r.json.sheet.revisions.map((x: { label: string; status: string }) => `${x.label}:${x.status}`)).toEqual(["A:approved", "B:draft"]);

    const a = await revision(T.viewer, sheetId, 0);
    expect(a.status).toBe(200);
    expect(a.json.revision).toMatchObject({ ordinal: 0, label: "A", status: "approved", inputErrors: null });
    expect(a.json.revision.inputs.length_m).toBe(210);
    expect(a.json.revision.results.kind).toBe("voltage-drop");
    expect(a.json.revision.checkedBy).not.toBeNull();
    const b = await revision(T.viewer, sheetId, 1);
    expect(b.json.revision.inputs.length_m).toBe(240);
    expect((await revision(T.viewer, sheetId, 2)).status).toBe(404);
    expect((await revision(T.viewer, sheetId, "B")).status).toBe(404);
  });

  it("a viewer's token reads but cannot create, save or submit (403)", async () => {
    expect((await get(T.viewer, sheetId)).status).toBe(200);
    const c = await create(T.viewer, { kind: "voltage-drop", tag: "VD-09", title: "Viewer's try", inputs: vd });
    expect(c.status).toBe(403);
    expect(c.json.error.code).toBe("forbidden");
    expect((await save(T.viewer, sheetId, { version: 5, inputs: vd })).status).toBe(403);
    expect((await transition(T.viewer, sheetId, { transition: "submit", version: 5 })).status).toBe(403);
    expect((await list(T.engineer)).json.sheets.map((s: { tag: string }) => s.tag)).not.toContain("VD-09");
  });

  it("another organisation's ids are 404 on every route, and nothing changes", async () => {
    const before = await get(T.engineer, sheetId);
    const o = T.outsider;
    const answers = [
      await list(o),
      await create(o, { kind: "voltage-drop", tag: "X-1", title: "Intruder", inputs: vd }),
      await get(o, sheetId),
      await save(o, sheetId, { version: before.json.sheet.version, inputs: vd }),
      await revision(o, sheetId, 0),
      await transition(o, sheetId, { transition: "submit", version: before.json.sheet.version }),
    ];
    for (const a of answers) {
      expect(a.status, JSON.stringify(a.json)).toBe(404);
      expect(a.json.error.code).toBe("not_found");
    }
    // …and the same from inside: our ids in their project.
    expect((await list(T.engineer, outsiderProjectId)).status).toBe(404);
    expect((await create(T.engineer, { kind: "voltage-drop", tag: "X-2", title: "Cross", inputs: vd }, outsiderProjectId)).status).toBe(404);
    const after = await get(T.engineer, sheetId);
    expect(after.json.sheet).toEqual(before.json.sheet);
  });

  it("ids that are not positive whole numbers are 404", async () => {
    for (const id of ["0", "-1", "abc", "1.5", "99999999999", ""]) {
      expect((await get(T.engineer, id)).status, id).toBe(404);
      expect((await list(T.engineer, id as unknown as number)).status, id).toBe(404);
    }
  });

  it("a revoked token is 401; a request with neither token nor session is 401", async () => {
    const t = await tokenFor(engineer, "to revoke");
    expect((await get(t, sheetId)).status).toBe(200);
    const row = (await listTokens(actorOf(engineer))).find((x) => x.name === "to revoke")!;
    await revokeToken(actorOf(engineer), row.id);
    const r = await get(t, sheetId);
    expect(r.status).toBe(401);
    expect(r.json.error.code).toBe("unauthenticated");
    session.userId = null;
    expect((await get(undefined as unknown as string, sheetId)).status).toBe(401);
  });
});

describe("API token routes: session only", () => {
  it("a bearer token cannot list, create or revoke tokens (403)", async () => {
    expect((await call(listTokensRoute, { token: T.engineer })).status).toBe(403);
    const minted = await call(createTokenRoute, { token: T.engineer, body: { name: "minted by a token" } });
    expect(minted.status).toBe(403);
    expect(minted.json.error.message).toMatch(/cannot manage API tokens/);
    const own = (await listTokens(actorOf(engineer)))[0]!;
    expect((await call(revokeTokenRoute, { token: T.engineer, method: "DELETE", params: { id: String(own.id) } })).status).toBe(403);
    expect((await listTokens(actorOf(engineer))).some((t) => t.name === "minted by a token")).toBe(false);
  });

  it("without a session the token routes are 401", async () => {
    session.userId = null;
    expect((await call(listTokensRoute)).status).toBe(401);
  });

  it("a signed-in user creates a token (secret once), uses it, lists it, revokes it", async () => {
    session.userId = engineer.id;
    try {
      const bad = await call(createTokenRoute, { body: { name: "   " } });
      expect(bad.status).toBe(400);
      expect(bad.json.error.fields.name).toMatch(/Token name is required/);

      const created = await call(createTokenRoute, { body: { name: "Build server" } });
      expect(created.status).toBe(201);
      const secret: string = created.json.secret;
      expect(secret).toMatch(/^ohm_/);
      expect(created.json.token).toMatchObject({ name: "Build server", prefix: secret.slice(0, 12), lastUsedAt: null, revokedAt: null });

      session.userId = null;
      expect((await call(calcKindsRoute, { token: secret })).status).toBe(200);
      session.userId = engineer.id;

      const listed = await call(listTokensRoute);
      expect(listed.status).toBe(200);
      const mine = listed.json.tokens.find((t: { id: number }) => t.id === created.json.token.id);
      expect(mine.lastUsedAt).not.toBeNull();
      expect(JSON.stringify(listed.json)).not.toContain(secret);

      const revoked = await call(revokeTokenRoute, { method: "DELETE", params: { id: String(mine.id) } });
      expect(revoked.status).toBe(200);
      expect(revoked.json).toMatchObject({ revoked: true, id: mine.id });
      session.userId = null;
      expect((await call(calcKindsRoute, { token: secret })).status).toBe(401);
    } finally {
      session.userId = null;
    }
  });

  it("another user's token is 404 to revoke", async () => {
    const theirs = (await listTokens(actorOf(engineer)))[0]!;
    const colleague = await makeUser(engineer.organisationId, "lead");
    session.userId = colleague.id;
    try {
      expect((await call(revokeTokenRoute, { method: "DELETE", params: { id: String(theirs.id) } })).status).toBe(404);
      expect((await call(revokeTokenRoute, { method: "DELETE", params: { id: "nope" } })).status).toBe(404);
    } finally {
      session.userId = null;
    }
  });
});
