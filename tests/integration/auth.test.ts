import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { signInAttempts, users } from "@/db/schema";
import { authorizeCredentials } from "@/lib/auth/options";
import { THROTTLE } from "@/lib/auth/throttle";
import { makeOrg, makeUser, resetDb, type TestUser } from "../support/db";

// Count hash verifications: the unknown-e-mail path must verify a hash too (equal timing).
const verifyCalls = vi.hoisted(() => ({ n: 0 }));
vi.mock("@node-rs/argon2", async (importOriginal) => {
  const real = await importOriginal<typeof import("@node-rs/argon2")>();
  return {
    ...real,
    verify: (...args: Parameters<typeof real.verify>) => {
      verifyCalls.n++;
      return real.verify(...args);
    },
  };
});

let user: TestUser;

beforeEach(async () => {
  await resetDb();
  const org = await makeOrg("Marsh Lane Controls");
  user = await makeUser(org.id, "engineer");
  verifyCalls.n = 0;
});

afterAll(async () => {
  await closeDb();
});

async function median(f: () => Promise<unknown>, n = 5): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = performance.now();
    await f();
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(n / 2)]!;
}

describe("authorizeCredentials", () => {
  it("signs in with the right password (e-mail case-insensitive) and records the sign-in", async () => {
    const res = await authorizeCredentials({ email: `  ${user.email.toUpperCase()} `, password: user.password });
    expect(res).toEqual({ id: String(user.id), name: user.name, email: user.email, organisationId: user.organisationId, role: "engineer" });
    expect(res).not.toHaveProperty("passwordHash");
    const [row] = await db().select({ lastSignInAt: users.lastSignInAt }).from(users).where(eq(users.id, user.id));
    expect(row?.lastSignInAt).toBeInstanceOf(Date);
    const attempts = await db().select().from(signInAttempts);
    expect(attempts.map((a) => a.succeeded)).toEqual(["success"]);
  });

  it("refuses a wrong password and an unknown e-mail alike; both verify a hash and take similar time", async () => {
    expect(await authorizeCredentials({ email: user.email, password: "wrong-password-000" })).toBeNull();
    expect(verifyCalls.n).toBe(1);
    expect(await authorizeCredentials({ email: "nobody@example.test", password: "wrong-password-000" })).toBeNull();
    expect(verifyCalls.n).toBe(2);

    // Fresh e-mails per call so the throttle does not step in.
    const others = await Promise.all(Array.from({ length: 5 }, () => makeUser(user.organisationId, "viewer")));
    let i = 0;
    const known = await median(() => authorizeCredentials({ email: others[i++]!.email, password: "nope-nope-nope" }));
    const unknown = await median(() => authorizeCredentials({ email: `ghost-${i++}@example.test`, password: "nope-nope-nope" }));
    // Loose bounds: the machine is shared; a missing hash check would be ~10x faster.
    expect(unknown).toBeGreaterThan(known * 0.3);
  });

  it("refuses malformed input without throwing", async () => {
    expect(await authorizeCredentials({ email: "not-an-email", password: "x" })).toBeNull();
    expect(await authorizeCredentials(null)).toBeNull();
    expect(await authorizeCredentials({ email: user.email, password: "" })).toBeNull();
  });

  it("refuses a deactivated user even with the right password", async () => {
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, user.id));
    expect(await authorizeCredentials({ email: user.email, password: user.password })).toBeNull();
  });
});

describe("throttling", () => {
  it(`locks an e-mail after ${THROTTLE.maxFailures} failures, says when to retry, a correct password does not unlock early, other e-mails are unaffected`, async () => {
    for (let i = 1; i < THROTTLE.maxFailures; i++) {
      expect(await authorizeCredentials({ email: user.email, password: `wrong-${i}` })).toBeNull();
    }
    // The failure that reaches the limit already reports the lock.
    await expect(authorizeCredentials({ email: user.email, password: "wrong-last" })).rejects.toThrow(/Try again in 15 minutes/);
    // Even the right password is refused while locked, without checking it.
    const before = verifyCalls.n;
    await expect(authorizeCredentials({ email: user.email, password: user.password })).rejects.toThrow(/Too many failed sign-ins.*Try again in \d+ minutes?/);
    expect(verifyCalls.n).toBe(before);

    const other = await makeUser(user.organisationId, "lead");
    expect(await authorizeCredentials({ email: other.email, password: other.password })).toMatchObject({ id: String(other.id) });
  });

  it("unlocks once the failures fall out of the window", async () => {
    const old = new Date(Date.now() - (THROTTLE.windowMinutes + 1) * 60_000);
    await db()
      .insert(signInAttempts)
      .values(Array.from({ length: THROTTLE.maxFailures }, () => ({ email: user.email, succeeded: "failure" as const, createdAt: old })));
    expect(await authorizeCredentials({ email: user.email, password: user.password })).toMatchObject({ id: String(user.id) });
  });
});
