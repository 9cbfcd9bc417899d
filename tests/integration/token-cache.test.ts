import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { users } from "@/db/schema";
import { guardedRoute, type Actor } from "@/lib/auth/guard";
import { createToken, forgetCachedBearers, resolveBearer, revokeToken, TOKEN_CACHE_TTL_MS } from "@/lib/auth/tokens";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// The route guard's short-lived token → actor cache: what it may serve stale, and for how long.

const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });
const whoami = guardedRoute({ permission: "sheet.read" }, async ({ actor }) => ({ id: actor.id, role: actor.role }));
const call = async (token: string) => {
  const res = await whoami(new Request("http://127.0.0.1/api/v1/whoami", { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve({}) });
  return { status: res.status, json: (await res.json()) as { id?: number; role?: string } };
};

let orgId: number;

beforeAll(async () => {
  orgId = (await makeOrg("Token Cache Works")).id;
});

afterEach(() => {
  vi.useRealTimers();
  forgetCachedBearers();
});

afterAll(async () => {
  await closeDb();
});

describe("route guard token cache", () => {
  it("a change made outside this process is served stale for at most TOKEN_CACHE_TTL_MS", async () => {
    const u = await makeUser(orgId, "engineer");
    const t = await createToken(actorOf(u), "cached");
    vi.useFakeTimers({ toFake: ["Date"], now: new Date() });
    expect(await call(t.token)).toEqual({ status: 200, json: { id: u.id, role: "engineer" } });

    // Deactivated behind the app's back (SQL by hand, another server process).
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, u.id));
    expect(await resolveBearer(t.token)).toBeNull(); // the uncached resolver sees it at once
    expect((await call(t.token)).status).toBe(200); // the cache has not expired yet

    vi.setSystemTime(Date.now() + TOKEN_CACHE_TTL_MS + 1);
    expect((await call(t.token)).status).toBe(401);
  });

  it("a revocation through the app holds from the very next request", async () => {
    const u = await makeUser(orgId, "engineer");
    const t = await createToken(actorOf(u), "revoked at once");
    expect((await call(t.token)).status).toBe(200);
    await revokeToken(actorOf(u), t.id);
    expect((await call(t.token)).status).toBe(401);
  });

  it("forgetCachedBearers (role and status changes in the admin screens) drops what was cached", async () => {
    const u = await makeUser(orgId, "lead");
    const t = await createToken(actorOf(u), "role change");
    expect((await call(t.token)).json.role).toBe("lead");
    await db().update(users).set({ role: "viewer" }).where(eq(users.id, u.id));
    forgetCachedBearers();
    expect((await call(t.token)).json.role).toBe("viewer");
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, u.id));
    forgetCachedBearers();
    expect((await call(t.token)).status).toBe(401);
  });

  it("refusals are never cached: a token refused once works as soon as its user is active again", async () => {
    const u = await makeUser(orgId, "engineer", { status: "deactivated" });
    const t = await createToken(actorOf(u), "comes back");
    expect((await call(t.token)).status).toBe(401);
    await db().update(users).set({ status: "active" }).where(eq(users.id, u.id));
    expect((await call(t.token)).status).toBe(200);
  });
});
