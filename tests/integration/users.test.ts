import { afterAll, beforeEach, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, invitations, mailOutbox, users } from "@/db/schema";
import {
  INVITATION_TTL_MS,
  acceptInvitation,
  changeUserRole,
  findInvitation,
  hashToken,
  inviteUser,
  listPendingInvitations,
  listUsers,
  revokeInvitation,
  setUserStatus,
  writeInvitation,
} from "@/db/queries/users";
import { authorizeCredentials } from "@/lib/auth/options";
import { AppError } from "@/lib/errors";
import { PASSWORD_RULE } from "@/lib/auth/password";
import { fieldErrors } from "@/lib/engine/core/schema";
import { PASSWORD_RULE as FORM_PASSWORD_RULE, acceptSchema } from "@/app/(auth)/invite/[token]/schema";
import { inviteSchema } from "@/app/(app)/admin/users/schema";
import { makeOrg, makeUser, resetDb, type TestUser } from "../support/db";

async function rejection(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error("expected the call to be refused");
}

let orgId: number;
let admin: TestUser;

beforeEach(async () => {
  await resetDb();
  orgId = (await makeOrg("Harrow Switchgear Works")).id;
  admin = await makeUser(orgId, "admin", { name: "Ada Admin" });
});

afterAll(async () => {
  await closeDb();
});

describe("invitations", () => {
  it("stores only the token's SHA-256, expires in 72 h, and queues the e-mail with the audit event", async () => {
    const now = new Date("2030-01-10T08:00:00.000Z");
    const { invitationId, token, expiresAt } = await inviteUser(admin, { email: "  New.Engineer@Example.test ", role: "engineer" }, now);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes, base64url
    expect(expiresAt.getTime() - now.getTime()).toBe(INVITATION_TTL_MS);

    const [inv] = await db().select().from(invitations).where(eq(invitations.id, invitationId));
    expect(inv?.tokenHash).toBe(hashToken(token));
    expect(inv?.tokenHash).not.toContain(token);
    expect(inv?.email).toBe("new.engineer@example.test");
    expect(inv?.expiresAt.toISOString()).toBe("2030-01-13T08:00:00.000Z");

    const mail = await db().select().from(mailOutbox);
    expect(mail).toHaveLength(1);
    expect(mail[0]?.toAddress).toBe("new.engineer@example.test");
    expect(mail[0]?.organisationId).toBe(orgId);
    expect(mail[0]?.textBody).toContain(`/invite/${token}`);
    expect(mail[0]?.subject).toContain("Harrow Switchgear Works");

    const events = await db().select().from(auditEvents).where(eq(auditEvents.event, "user.invited"));
    expect(events).toHaveLength(1);
    expect(events[0]?.entityId).toBe(invitationId);
    expect(events[0]?.details).toMatchObject({ email: "new.engineer@example.test", role: "engineer" });

    const pending = await listPendingInvitations(orgId);
    expect(pending.map((p) => p.email)).toEqual(["new.engineer@example.test"]);
    expect(pending[0]?.invitedByName).toBe("Ada Admin");
  });

  it("writes nothing when the surrounding transaction rolls back (no invitation, no outbox row, no audit)", async () => {
    await expect(
      db().transaction(async (tx) => {
        await writeInvitation(tx, admin, { email: "rollback@example.test", role: "viewer" });
        throw new Error("later step failed");
      }),
    ).rejects.toThrow("later step failed");
    expect(await db().select().from(invitations)).toHaveLength(0);
    expect(await db().select().from(mailOutbox)).toHaveLength(0);
    expect(await db().select().from(auditEvents)).toHaveLength(0);
  });

  it("refuses an e-mail that already belongs to a user, as a field error", async () => {
    const other = await makeUser(orgId, "viewer");
    const err = await rejection(inviteUser(admin, { email: other.email.toUpperCase(), role: "lead" }));
    expect(err.code).toBe("validation");
    expect(err.fields?.email).toMatch(/already belongs/);
    expect(await db().select().from(mailOutbox)).toHaveLength(0);
  });

  it("re-inviting the same address replaces the pending invitation", async () => {
    const first = await inviteUser(admin, { email: "twice@example.test", role: "viewer" });
    const second = await inviteUser(admin, { email: "twice@example.test", role: "engineer" });
    expect((await findInvitation(first.token))?.state).toBe("revoked");
    expect((await findInvitation(second.token))?.state).toBe("valid");
    expect(await listPendingInvitations(orgId)).toHaveLength(1);
  });

  it("is accepted once: creates the user with an argon2id hash and records user.joined; a second use is refused", async () => {
    const { token, invitationId } = await inviteUser(admin, { email: "joiner@example.test", role: "lead" });
    const view = await findInvitation(token);
    expect(view).toMatchObject({ state: "valid", email: "joiner@example.test", role: "lead", organisationName: "Harrow Switchgear Works" });

    const joined = await acceptInvitation({ token, name: "Jo Iner", password: "a-long-password-1" });
    const [u] = await db().select().from(users).where(eq(users.id, joined.userId));
    expect(u).toMatchObject({ email: "joiner@example.test", role: "lead", status: "active", organisationId: orgId, name: "Jo Iner" });
    expect(u?.passwordHash).toMatch(/^\$argon2id\$/);
    const [inv] = await db().select().from(invitations).where(eq(invitations.id, invitationId));
    expect(inv?.acceptedAt).toBeInstanceOf(Date);
    const [ev] = await db().select().from(auditEvents).where(eq(auditEvents.event, "user.joined"));
    expect(ev).toMatchObject({ actorId: joined.userId, entityId: joined.userId, organisationId: orgId });

    // The new user can sign in with the chosen password.
    expect(await authorizeCredentials({ email: "joiner@example.test", password: "a-long-password-1" })).toMatchObject({ role: "lead" });

    const again = await rejection(acceptInvitation({ token, name: "Someone Else", password: "another-password-2" }));
    expect(again.code).toBe("conflict");
    expect(again.message).toMatch(/already used/);
    expect((await findInvitation(token))?.state).toBe("used");
    expect(await db().select().from(users).where(eq(users.email, "joiner@example.test"))).toHaveLength(1);
  });

  it("refuses an expired invitation and a revoked one; an unknown token is not found", async () => {
    const issued = new Date(Date.now() - INVITATION_TTL_MS - 60_000);
    const expired = await inviteUser(admin, { email: "late@example.test", role: "viewer" }, issued);
    expect((await findInvitation(expired.token))?.state).toBe("expired");
    // Still listed (so it can be seen and replaced), marked expired.
    expect((await listPendingInvitations(orgId)).map((i) => [i.email, i.expired])).toEqual([["late@example.test", true]]);
    const e1 = await rejection(acceptInvitation({ token: expired.token, name: "Late Comer", password: "a-long-password-1" }));
    expect(e1.code).toBe("conflict");
    expect(e1.message).toMatch(/expired.*new invitation/);

    const revoked = await inviteUser(admin, { email: "withdrawn@example.test", role: "viewer" });
    await revokeInvitation(admin, revoked.invitationId);
    const e2 = await rejection(acceptInvitation({ token: revoked.token, name: "Not Wanted", password: "a-long-password-1" }));
    expect(e2.message).toMatch(/withdrawn/);
    expect(await db().select().from(users).where(eq(users.email, "withdrawn@example.test"))).toHaveLength(0);
    expect(await db().select().from(auditEvents).where(eq(auditEvents.event, "user.invite_revoked"))).toHaveLength(1);

    expect(await findInvitation("no-such-token")).toBeNull();
    expect((await rejection(acceptInvitation({ token: "no-such-token", name: "X Y", password: "a-long-password-1" }))).code).toBe("not_found");
  });

  it("another organisation's invitation cannot be revoked (not found)", async () => {
    const otherOrg = await makeOrg("Elsewhere Panels");
    const otherAdmin = await makeUser(otherOrg.id, "admin");
    const { invitationId } = await inviteUser(otherAdmin, { email: "theirs@example.test", role: "viewer" });
    expect((await rejection(revokeInvitation(admin, invitationId))).code).toBe("not_found");
  });
});

describe("roles and status", () => {
  it("changes a role and records from/to in the audit event", async () => {
    const eng = await makeUser(orgId, "engineer");
    expect(await changeUserRole(admin, eng.id, "lead")).toEqual({ changed: true });
    const [row] = await db().select({ role: users.role }).from(users).where(eq(users.id, eng.id));
    expect(row?.role).toBe("lead");
    const events = await db().select().from(auditEvents).where(and(eq(auditEvents.event, "user.role_changed"), eq(auditEvents.entityId, eng.id)));
    expect(events).toHaveLength(1);
    expect(events[0]?.actorId).toBe(admin.id);
    expect(events[0]?.details).toEqual({ email: eng.email, from: "engineer", to: "lead" });
    // No change, no event.
    expect(await changeUserRole(admin, eng.id, "lead")).toEqual({ changed: false });
    expect(await db().select().from(auditEvents)).toHaveLength(1);
  });

  it("the last active admin cannot be demoted or deactivated, by themselves or anyone", async () => {
    const demote = await rejection(changeUserRole(admin, admin.id, "engineer"));
    expect(demote.code).toBe("conflict");
    expect(demote.message).toMatch(/You are the only active administrator/);
    const deactivate = await rejection(setUserStatus(admin, admin.id, "deactivated"));
    expect(deactivate.message).toMatch(/only active administrator.*Make another user an administrator first/);

    // A second admin who is deactivated does not count.
    const dormant = await makeUser(orgId, "admin", { status: "deactivated" });
    expect((await rejection(changeUserRole(dormant, admin.id, "viewer"))).message).toMatch(/Ada Admin is the only active administrator/);

    const [row] = await db().select().from(users).where(eq(users.id, admin.id));
    expect(row).toMatchObject({ role: "admin", status: "active" });
    expect(await db().select().from(auditEvents)).toHaveLength(0);
  });

  it("with two active admins one may step down, and then the other is the last", async () => {
    const second = await makeUser(orgId, "admin");
    expect(await changeUserRole(admin, admin.id, "lead")).toEqual({ changed: true });
    expect((await rejection(setUserStatus(second, second.id, "deactivated"))).code).toBe("conflict");
  });

  it("two concurrent demotions of the only two admins: exactly one succeeds", async () => {
    const second = await makeUser(orgId, "admin");
    const results = await Promise.allSettled([changeUserRole(admin, second.id, "engineer"), changeUserRole(second, admin.id, "engineer")]);
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
    const active = await db().select().from(users).where(and(eq(users.organisationId, orgId), eq(users.role, "admin")));
    expect(active).toHaveLength(1);
  });

  it("deactivates and reactivates with audit events; a deactivated user cannot sign in", async () => {
    const eng = await makeUser(orgId, "engineer");
    await setUserStatus(admin, eng.id, "deactivated");
    expect(await authorizeCredentials({ email: eng.email, password: eng.password })).toBeNull();
    await setUserStatus(admin, eng.id, "active");
    expect(await authorizeCredentials({ email: eng.email, password: eng.password })).toMatchObject({ id: String(eng.id) });
    const events = (await db().select().from(auditEvents)).map((e) => e.event);
    // The successful sign-in after reactivation is itself audited.
    expect(events).toEqual(["user.deactivated", "user.reactivated", "user.signed_in"]);
    const list = await listUsers(orgId);
    expect(list.find((u) => u.id === eng.id)?.status).toBe("active");
    expect(Object.keys(list[0]!)).not.toContain("passwordHash");
  });

  it("another organisation's user is not found, and nothing changes", async () => {
    const otherOrg = await makeOrg("Elsewhere Panels");
    const theirs = await makeUser(otherOrg.id, "engineer");
    expect((await rejection(changeUserRole(admin, theirs.id, "viewer"))).code).toBe("not_found");
    expect((await rejection(setUserStatus(admin, theirs.id, "deactivated"))).code).toBe("not_found");
    const [row] = await db().select().from(users).where(eq(users.id, theirs.id));
    expect(row).toMatchObject({ role: "engineer", status: "active" });
    expect((await listUsers(orgId)).map((u) => u.id)).not.toContain(theirs.id);
  });
});

describe("form schemas (shared by browser and server)", () => {
  it("the invitation form's password rule is the one the server hashes under", () => {
    expect(FORM_PASSWORD_RULE).toEqual(PASSWORD_RULE);
  });

  it("accepting: names the field for a short password and for a mismatched confirmation", () => {
    const short = acceptSchema.safeParse({ token: "t", name: "Al", password: "123456789", confirm: "123456789" });
    expect(short.success).toBe(false);
    if (!short.success) expect(fieldErrors(short.error)).toEqual({ password: "Password must be at least 10 characters" });
    const mismatch = acceptSchema.safeParse({ token: "t", name: "Al Bee", password: "0123456789", confirm: "0123456788" });
    expect(mismatch.success).toBe(false);
    if (!mismatch.success) expect(fieldErrors(mismatch.error)).toEqual({ confirm: "The two passwords do not match" });
  });

  it("inviting: normalises the e-mail and lists the allowed roles in the message", () => {
    expect(inviteSchema.parse({ email: " A.B@Example.TEST ", role: "viewer" })).toEqual({ email: "a.b@example.test", role: "viewer" });
    const bad = inviteSchema.safeParse({ email: "nope", role: "owner" });
    expect(bad.success).toBe(false);
    if (!bad.success) {
      const f = fieldErrors(bad.error);
      expect(f.email).toMatch(/E-mail must be an address/);
      expect(f.role).toBe("Role must be one of: admin, lead, engineer, viewer");
    }
  });
});
