import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { apiTokens, auditEvents, users } from "@/db/schema";
import { guardedRoute, type Actor } from "@/lib/auth/guard";
import { createToken, hashToken, LAST_USED_RESOLUTION_MS, listTokens, resolveBearer, revokeToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// Each test works in organisations of its own, so no table needs emptying.
const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });

async function caught(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (err) {
    expect(err).toBeInstanceOf(AppError);
    return err as AppError;
  }
  throw new Error("expected the call to fail");
}

async function tokenRow(id: number) {
  const [row] = await db().select().from(apiTokens).where(eq(apiTokens.id, id));
  return row!;
}
async function tokenAudit(id: number) {
  return db()
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.entityType, "api_token"), eq(auditEvents.entityId, id)))
    .orderBy(auditEvents.id);
}

let eng: Actor;
let viewer: Actor;
let colleague: Actor;
let outsider: Actor;

beforeAll(async () => {
  const org = await makeOrg("Token Works");
  const other = await makeOrg("Elsewhere Works");
  eng = actorOf(await makeUser(org.id, "engineer"));
  viewer = actorOf(await makeUser(org.id, "viewer"));
  colleague = actorOf(await makeUser(org.id, "engineer"));
  outsider = actorOf(await makeUser(other.id, "engineer"));
});

afterAll(async () => {
  await closeDb();
});

describe("API tokens", () => {
  it("creates a token shown once; only its SHA-256 and prefix are stored, with an audit event", async () => {
    const t = await createToken(eng, "  CI export  ");
    expect(t.token).toMatch(/^ohm_[A-Za-z0-9_-]{43}$/);
    expect(t.prefix).toBe(t.token.slice(0, 12));
    expect(t.name).toBe("CI export");
    const row = await tokenRow(t.id);
    expect(row).toMatchObject({ userId: eng.id, organisationId: eng.organisationId, name: "CI export", prefix: t.prefix, tokenHash: hashToken(t.token), revokedAt: null });
    expect(row.tokenHash).not.toContain(t.token.slice(4));
    const events = await tokenAudit(t.id);
    expect(events.map((e) => e.event)).toEqual(["token.created"]);
    expect(events[0]!.details).toEqual({ name: "CI export", prefix: t.prefix });
    expect(JSON.stringify(events[0]!.details)).not.toContain(t.token);
  });

  it("two tokens never collide", async () => {
    const a = await createToken(eng, "a");
    const b = await createToken(eng, "b");
    expect(a.token).not.toBe(b.token);
  });

  it("validates the name (400 on the name field); every role may manage its own tokens", async () => {
    expect((await caught(createToken(eng, ""))).fields).toEqual({ name: "Token name is required (1 to 80 characters)" });
    expect((await caught(createToken(eng, "x".repeat(81)))).fields).toEqual({ name: "Token name must be at most 80 characters" });
    expect((await caught(createToken(eng, 42))).status).toBe(400);
    await expect(createToken(viewer, "read-only dashboard")).resolves.toMatchObject({ name: "read-only dashboard" });
  });

  it("resolves a live token to its user, recording the use at most once a minute", async () => {
    const t = await createToken(eng, "resolver");
    const actor = await resolveBearer(t.token);
    expect(actor).toEqual(eng);
    const first = (await tokenRow(t.id)).lastUsedAt;
    expect(first).toBeInstanceOf(Date);

    await resolveBearer(t.token);
    expect((await tokenRow(t.id)).lastUsedAt).toEqual(first);

    const old = new Date(Date.now() - LAST_USED_RESOLUTION_MS - 5000);
    await db().update(apiTokens).set({ lastUsedAt: old }).where(eq(apiTokens.id, t.id));
    await resolveBearer(t.token);
    const later = (await tokenRow(t.id)).lastUsedAt!;
    expect(later.getTime()).toBeGreaterThan(old.getTime() + LAST_USED_RESOLUTION_MS);
  });

  it("rejects malformed and unknown tokens", async () => {
    const t = await createToken(eng, "shape");
    expect(await resolveBearer("")).toBeNull();
    expect(await resolveBearer("not-a-token")).toBeNull();
    expect(await resolveBearer(t.token.slice(0, -1))).toBeNull();
    expect(await resolveBearer(`ohm_${"A".repeat(43)}`)).toBeNull();
    expect(await resolveBearer(t.token + "x")).toBeNull();
  });

  it("lists the actor's own tokens without secrets", async () => {
    const t = await createToken(colleague, "colleague's");
    const mine = await listTokens(eng);
    expect(mine.length).toBeGreaterThan(0);
    expect(mine.map((x) => x.id)).not.toContain(t.id);
    for (const x of mine) expect(Object.keys(x).sort()).toEqual(["createdAt", "id", "lastUsedAt", "name", "prefix", "revokedAt"]);
    expect((await listTokens(colleague)).map((x) => x.id)).toEqual([t.id]);
  });

  it("revokes: the token stops resolving; revoking again changes nothing; others' tokens are 404", async () => {
    const t = await createToken(eng, "to revoke");
    expect(await resolveBearer(t.token)).not.toBeNull();

    expect((await caught(revokeToken(colleague, t.id))).status).toBe(404);
    expect((await caught(revokeToken(outsider, t.id))).status).toBe(404);
    expect((await caught(revokeToken(eng, "abc"))).status).toBe(400);
    expect(await resolveBearer(t.token)).not.toBeNull();

    const r = await revokeToken(eng, t.id);
    expect(r.revokedAt).toBeInstanceOf(Date);
    expect(await resolveBearer(t.token)).toBeNull();
    const again = await revokeToken(eng, t.id);
    expect(again.revokedAt.getTime()).toBe(r.revokedAt.getTime());
    expect((await tokenAudit(t.id)).map((e) => e.event)).toEqual(["token.created", "token.revoked"]);
    expect((await listTokens(eng)).find((x) => x.id === t.id)?.revokedAt).toBeInstanceOf(Date);
  });

  it("a deactivated user's token stops resolving, and works again on reactivation", async () => {
    const u = actorOf(await makeUser(eng.organisationId, "lead"));
    const t = await createToken(u, "lead's script");
    expect((await resolveBearer(t.token))?.role).toBe("lead");
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, u.id));
    expect(await resolveBearer(t.token)).toBeNull();
    await db().update(users).set({ status: "active", role: "viewer" }).where(eq(users.id, u.id));
    // The token acts with the user's current role.
    expect((await resolveBearer(t.token))?.role).toBe("viewer");
  });

  it("is wired into guardedRoute by importing the module: Bearer tokens authenticate API requests", async () => {
    const t = await createToken(eng, "route");
    const handler = guardedRoute({ permission: "sheet.read" }, async ({ actor }) => ({ id: actor.id, organisationId: actor.organisationId }));
    const call = (token: string) => handler(new Request("http://127.0.0.1/api/v1/whoami", { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve({}) });
    const ok = await call(t.token);
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ id: eng.id, organisationId: eng.organisationId });
    await revokeToken(eng, t.id);
    const refused = await call(t.token);
    expect(refused.status).toBe(401);
    expect(((await refused.json()) as { error: { code: string } }).error.code).toBe("unauthenticated");
  });
});
