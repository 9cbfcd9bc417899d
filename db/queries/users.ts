import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { and, asc, desc, eq, isNull } from "drizzle-orm";
import { alias } from "drizzle-orm/mysql-core";
import { db, type Tx } from "@/db/client";
import { invitations, organisations, users, type Role, type UserStatus } from "@/db/schema";
import type { Actor } from "@/lib/auth/guard";
import { hashPassword } from "@/lib/auth/password";
import { audit } from "@/lib/audit";
import { conflict, isDuplicateKey, notFound, validationError } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { inviteMail } from "@/lib/mail/templates";

/** Users, invitations and the rules around them. Every function is scoped to one organisation. */

export const INVITATION_TTL_MS = 72 * 60 * 60 * 1000;

export interface UserListItem {
  id: number;
  name: string;
  email: string;
  role: Role;
  status: UserStatus;
  lastSignInAt: Date | null;
  createdAt: Date;
}

export async function listUsers(organisationId: number): Promise<UserListItem[]> {
  return db()
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      role: users.role,
      status: users.status,
      lastSignInAt: users.lastSignInAt,
      createdAt: users.createdAt,
    })
    .from(users)
    .where(eq(users.organisationId, organisationId))
    .orderBy(asc(users.status), asc(users.name));
}

export interface PendingInvitation {
  id: number;
  email: string;
  role: Role;
  expiresAt: Date;
  createdAt: Date;
  invitedByName: string | null;
  expired: boolean;
}

/** Invitations neither accepted nor revoked (expired ones included, so they can be seen and replaced). */
export async function listPendingInvitations(organisationId: number, now = new Date()): Promise<PendingInvitation[]> {
  const inviter = alias(users, "inviter");
  const rows = await db()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      createdAt: invitations.createdAt,
      invitedByName: inviter.name,
    })
    .from(invitations)
    .leftJoin(inviter, and(eq(inviter.id, invitations.invitedById), eq(inviter.organisationId, invitations.organisationId)))
    .where(and(eq(invitations.organisationId, organisationId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt));
  return rows.map((r) => ({ ...r, expired: r.expiresAt.getTime() <= now.getTime() }));
}

/** Only the SHA-256 of an invitation token is stored; the token itself travels in the e-mail. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function newInviteToken(): string {
  return randomBytes(32).toString("base64url");
}

const normaliseEmail = (email: string) => email.trim().toLowerCase();

/**
 * Creates an invitation, its e-mail in the outbox and the audit event in the caller's
 * transaction. A pending invitation to the same address in this organisation is replaced.
 */
export async function writeInvitation(
  tx: Tx,
  actor: Actor,
  input: { email: string; role: Role },
  now = new Date(),
): Promise<{ invitationId: number; token: string; expiresAt: Date }> {
  const email = normaliseEmail(input.email);
  const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, email)).limit(1);
  if (existing) throw validationError({ email: "This e-mail already belongs to an Ohmstead account" }, "This e-mail already belongs to an Ohmstead account");

  const [org] = await tx.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, actor.organisationId)).limit(1);
  if (!org) throw notFound("Organisation not found");

  const replaced = await tx
    .select({ id: invitations.id })
    .from(invitations)
    .where(and(eq(invitations.organisationId, actor.organisationId), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .for("update");
  for (const r of replaced) {
    await tx.update(invitations).set({ revokedAt: now }).where(eq(invitations.id, r.id));
  }

  const token = newInviteToken();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const [row] = await tx
    .insert(invitations)
    .values({ organisationId: actor.organisationId, email, role: input.role, tokenHash: hashToken(token), invitedById: actor.id, expiresAt })
    .$returningId();
  if (!row) throw new Error("writeInvitation: insert returned no id");

  await enqueueMail(tx, {
    organisationId: actor.organisationId,
    to: email,
    ...inviteMail({ organisationName: org.name, inviterName: actor.name, role: input.role, token, expiresAt }),
  });
  await audit(tx, {
    organisationId: actor.organisationId,
    actorId: actor.id,
    event: "user.invited",
    entityType: "invitation",
    entityId: row.id,
    details: { email, role: input.role, expiresAt: expiresAt.toISOString(), ...(replaced.length ? { replacedInvitationIds: replaced.map((r) => r.id) } : {}) },
  });
  return { invitationId: row.id, token, expiresAt };
}

export function inviteUser(actor: Actor, input: { email: string; role: Role }, now = new Date()) {
  return db().transaction((tx) => writeInvitation(tx, actor, input, now));
}

export async function revokeInvitation(actor: Actor, invitationId: number, now = new Date()): Promise<void> {
  await db().transaction(async (tx) => {
    const [inv] = await tx
      .select({ id: invitations.id, email: invitations.email, acceptedAt: invitations.acceptedAt, revokedAt: invitations.revokedAt })
      .from(invitations)
      .where(and(eq(invitations.id, invitationId), eq(invitations.organisationId, actor.organisationId)))
      .for("update");
    if (!inv) throw notFound("Invitation not found");
    if (inv.acceptedAt) throw conflict(`The invitation to ${inv.email} was already accepted; manage the user instead`);
    if (inv.revokedAt) return;
    await tx.update(invitations).set({ revokedAt: now }).where(eq(invitations.id, inv.id));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "user.invite_revoked",
      entityType: "invitation",
      entityId: inv.id,
      details: { email: inv.email },
    });
  });
}

interface Target {
  id: number;
  name: string;
  email: string;
  role: Role;
  status: UserStatus;
}

/**
 * Locks the organisation's active administrators (always first, in id order, so two
 * concurrent demotions queue instead of both passing the check), then the target user.
 */
async function lockForChange(tx: Tx, organisationId: number, userId: number): Promise<{ target: Target; activeAdminIds: number[] }> {
  const admins = await tx
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.organisationId, organisationId), eq(users.role, "admin"), eq(users.status, "active")))
    .orderBy(asc(users.id))
    .for("update");
  const [target] = await tx
    .select({ id: users.id, name: users.name, email: users.email, role: users.role, status: users.status })
    .from(users)
    .where(and(eq(users.id, userId), eq(users.organisationId, organisationId)))
    .for("update");
  if (!target) throw notFound("User not found");
  return { target, activeAdminIds: admins.map((a) => a.id) };
}

function refuseLastAdmin(target: Target, activeAdminIds: number[], actor: Actor, what: string) {
  if (target.role === "admin" && target.status === "active" && activeAdminIds.length <= 1) {
    const who = target.id === actor.id ? "You are" : `${target.name} is`;
    throw conflict(`${who} the only active administrator of this organisation, so cannot be ${what}. Make another user an administrator first.`);
  }
}

export async function changeUserRole(actor: Actor, userId: number, role: Role): Promise<{ changed: boolean }> {
  return db().transaction(async (tx) => {
    const { target, activeAdminIds } = await lockForChange(tx, actor.organisationId, userId);
    if (target.role === role) return { changed: false };
    if (role !== "admin") refuseLastAdmin(target, activeAdminIds, actor, "given another role");
    await tx.update(users).set({ role }).where(eq(users.id, target.id));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "user.role_changed",
      entityType: "user",
      entityId: target.id,
      details: { email: target.email, from: target.role, to: role },
    });
    return { changed: true };
  });
}

export async function setUserStatus(actor: Actor, userId: number, status: UserStatus): Promise<{ changed: boolean }> {
  return db().transaction(async (tx) => {
    const { target, activeAdminIds } = await lockForChange(tx, actor.organisationId, userId);
    if (target.status === status) return { changed: false };
    if (status === "deactivated") refuseLastAdmin(target, activeAdminIds, actor, "deactivated");
    await tx.update(users).set({ status }).where(eq(users.id, target.id));
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: status === "deactivated" ? "user.deactivated" : "user.reactivated",
      entityType: "user",
      entityId: target.id,
      details: { email: target.email },
    });
    return { changed: true };
  });
}

// ── Invitation acceptance (public: the token is the credential) ────────────────────

export type InvitationState = "valid" | "expired" | "used" | "revoked";

export interface InvitationView {
  state: InvitationState;
  email: string;
  role: Role;
  organisationName: string;
  expiresAt: Date;
}

function stateOf(inv: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now: Date): InvitationState {
  if (inv.acceptedAt) return "used";
  if (inv.revokedAt) return "revoked";
  if (inv.expiresAt.getTime() <= now.getTime()) return "expired";
  return "valid";
}

/** The invitation behind a token, or null when no invitation has that token. */
export async function findInvitation(token: string, now = new Date()): Promise<InvitationView | null> {
  if (!token || token.length > 200) return null;
  const [inv] = await db()
    .select({
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      organisationName: organisations.name,
    })
    .from(invitations)
    .innerJoin(organisations, eq(organisations.id, invitations.organisationId))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .limit(1);
  if (!inv) return null;
  return { state: stateOf(inv, now), email: inv.email, role: inv.role, organisationName: inv.organisationName, expiresAt: inv.expiresAt };
}

export const INVITATION_REFUSALS: Record<Exclude<InvitationState, "valid">, string> = {
  expired: "This invitation has expired. Ask your administrator for a new invitation.",
  used: "This invitation was already used. Sign in with the e-mail it was sent to, or ask your administrator for a new invitation.",
  revoked: "This invitation was withdrawn. Ask your administrator for a new invitation.",
};

/** Creates the user, marks the invitation accepted and records "user.joined", in one transaction. */
export async function acceptInvitation(
  input: { token: string; name: string; password: string },
  now = new Date(),
): Promise<{ userId: number; email: string; organisationId: number }> {
  const passwordHash = await hashPassword(input.password);
  try {
    return await db().transaction(async (tx) => {
      const [inv] = await tx
        .select({
          id: invitations.id,
          organisationId: invitations.organisationId,
          email: invitations.email,
          role: invitations.role,
          invitedById: invitations.invitedById,
          expiresAt: invitations.expiresAt,
          acceptedAt: invitations.acceptedAt,
          revokedAt: invitations.revokedAt,
        })
        .from(invitations)
        .where(eq(invitations.tokenHash, hashToken(input.token)))
        .for("update");
      if (!inv) throw notFound("This invitation link is not valid. Ask your administrator for a new invitation.");
      const state = stateOf(inv, now);
      if (state !== "valid") throw conflict(INVITATION_REFUSALS[state]);

      const [user] = await tx
        .insert(users)
        .values({ organisationId: inv.organisationId, email: inv.email, name: input.name.trim(), passwordHash, role: inv.role, status: "active" })
        .$returningId();
      if (!user) throw new Error("acceptInvitation: insert returned no id");
      await tx.update(invitations).set({ acceptedAt: now }).where(eq(invitations.id, inv.id));
      await audit(tx, {
        organisationId: inv.organisationId,
        actorId: user.id,
        event: "user.joined",
        entityType: "user",
        entityId: user.id,
        details: { email: inv.email, role: inv.role, invitationId: inv.id, invitedById: inv.invitedById },
      });
      return { userId: user.id, email: inv.email, organisationId: inv.organisationId };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw conflict("An account with this e-mail already exists. Sign in instead, or ask your administrator.");
    throw err;
  }
}
