import "server-only";
import { randomBytes } from "node:crypto";
import { z } from "zod";
import { db } from "@/db/client";
import { findLiveTokenOwner, insertToken, listUserTokens, lockUserToken, markTokenRevoked, touchToken, type TokenListItem } from "@/db/queries/tokens";
import { audit } from "@/lib/audit";
import { fieldErrors } from "@/lib/engine/core/schema";
import { forbidden, notFound, validationError } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { registerBearerResolver, type Actor } from "./guard";
import { can } from "./roles";

/**
 * Personal API tokens for the JSON API: `ohm_` + 43 base64url characters (32 random
 * bytes). The token is shown once at creation; only its SHA-256 and a short prefix
 * are stored. A token acts as its user, with the user's current role, and stops
 * working when revoked or when the user is deactivated.
 */

/** A token as listed to its owner (no secret, no hash). */
export type { TokenListItem };

/** Every token starts with this. */
export const TOKEN_PREFIX = "ohm_";
const TOKEN_PATTERN = /^ohm_[A-Za-z0-9_-]{43}$/;
/** Characters of the token kept as its visible prefix ("ohm_" + 8). */
const PREFIX_LENGTH = 12;
/** last_used_at is written at most once per this interval per token. */
export const LAST_USED_RESOLUTION_MS = 60_000;

/** Name of a token as its owner types it. */
export const tokenNameSchema = z
  .string({ error: "Token name is required (1 to 80 characters)" })
  .trim()
  .min(1, "Token name is required (1 to 80 characters)")
  .max(80, "Token name must be at most 80 characters");

/** A new random token. */
export function generateToken(): string {
  return TOKEN_PREFIX + randomBytes(32).toString("base64url");
}

/** The SHA-256 hex stored for a token. */
export function hashToken(token: string): string {
  return sha256Hex(token);
}

function requireTokenManage(actor: Actor) {
  if (!can(actor.role, "token.manage")) throw forbidden();
}

function parseId(raw: unknown): number {
  const r = z.coerce.number().int().min(1).safeParse(raw);
  if (!r.success) throw validationError({ id: "Token id must be a whole number from 1" });
  return r.data;
}

/**
 * Creates a token for the actor. The returned `token` is the only time the secret is
 * available. Needs `token.manage`. Errors: 403 role; 400 name missing or too long.
 */
export async function createToken(actor: Actor, name: unknown): Promise<{ id: number; name: string; token: string; prefix: string }> {
  requireTokenManage(actor);
  const parsed = tokenNameSchema.safeParse(name);
  if (!parsed.success) throw validationError(Object.fromEntries(Object.values(fieldErrors(parsed.error)).map((m) => ["name", m])));
  const token = generateToken();
  const prefix = token.slice(0, PREFIX_LENGTH);
  const id = await db().transaction(async (tx) => {
    const id = await insertToken(tx, { organisationId: actor.organisationId, userId: actor.id, name: parsed.data, prefix, tokenHash: hashToken(token) });
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "token.created",
      entityType: "api_token",
      entityId: id,
      details: { name: parsed.data, prefix },
    });
    return id;
  });
  return { id, name: parsed.data, token, prefix };
}

/** The actor's own tokens (prefix, name, dates; never the secret). Needs `token.manage`. */
export async function listTokens(actor: Actor): Promise<TokenListItem[]> {
  requireTokenManage(actor);
  return listUserTokens(actor.organisationId, actor.id);
}

/**
 * Revokes one of the actor's tokens; revoking a revoked token changes nothing.
 * Errors: 403 role; 400 bad id; 404 not the actor's token (another user's or
 * another organisation's token is not found).
 */
export async function revokeToken(actor: Actor, id: unknown): Promise<{ id: number; revokedAt: Date }> {
  requireTokenManage(actor);
  const tokenId = parseId(id);
  const revoked = await db().transaction(async (tx) => {
    const t = await lockUserToken(tx, actor.organisationId, actor.id, tokenId);
    if (!t) throw notFound("Token not found");
    if (t.revokedAt) return { id: t.id, revokedAt: t.revokedAt };
    const at = new Date();
    await markTokenRevoked(tx, actor.organisationId, t.id, at);
    await audit(tx, {
      organisationId: actor.organisationId,
      actorId: actor.id,
      event: "token.revoked",
      entityType: "api_token",
      entityId: t.id,
      details: { name: t.name, prefix: t.prefix },
    });
    return { id: t.id, revokedAt: at };
  });
  // After the commit: a look-up that starts now sees the revocation; one in flight is not stored.
  forgetCachedBearers();
  return revoked;
}

/** The user a live token acts as, recording the use (at most once a minute). */
async function lookupBearer(tokenHash: string): Promise<Actor | null> {
  const found = await findLiveTokenOwner(tokenHash);
  if (!found) return null;
  const now = new Date();
  const notAfter = new Date(now.getTime() - LAST_USED_RESOLUTION_MS);
  if (!found.lastUsedAt || found.lastUsedAt < notAfter) await touchToken(found.tokenId, now, notAfter);
  return found.user;
}

/**
 * The user a bearer token acts as, or null when the token is malformed, unknown,
 * revoked, or its user is deactivated. Always asks the database; records the use (at
 * most once a minute).
 */
export async function resolveBearer(token: string): Promise<Actor | null> {
  const t = token.trim();
  if (!TOKEN_PATTERN.test(t)) return null;
  return lookupBearer(hashToken(t));
}

// ── The route guard's short-lived cache of token → actor ───────────────────────────
//
// A script calling the JSON API sends the same token many times a second; asking the
// database each time costs a round trip (and a pool connection) per request. The guard
// therefore keeps what a token resolved to for TOKEN_CACHE_TTL_MS, in this server process.
//
// Staleness it allows, and how it is bounded:
// - Revoking a token (revokeToken), and changing a user's role or status through the
//   administration screens (which call forgetCachedBearers), empty the cache at once, so
//   in a single-process server such a change holds from the very next request, as before.
// - A change this process does not see (another server process, or SQL run by hand) is
//   picked up when the entry expires: a revoked token or a deactivated user is refused,
//   and a new role applies, at most TOKEN_CACHE_TTL_MS later.
// - Only successful look-ups are kept; an unknown or revoked token always asks the
//   database. Entries hold no secret (the key is the token's SHA-256) and the cache holds
//   at most TOKEN_CACHE_MAX entries.
// `resolveBearer` itself stays uncached for callers that need the database's answer now.

/** How long a resolved token is trusted without asking the database again. */
export const TOKEN_CACHE_TTL_MS = 3_000;
const TOKEN_CACHE_MAX = 1_000;

// Kept on globalThis: the bundler gives route handlers and server actions module
// instances of their own, and a revocation in one must empty the cache the others read.
interface BearerCache {
  entries: Map<string, { actor: Actor; until: number }>;
  /** Bumped by every invalidation, so a look-up that raced with one is not stored. */
  generation: number;
}
const g = globalThis as unknown as { ohmsteadBearerCache?: BearerCache };
function cache(): BearerCache {
  g.ohmsteadBearerCache ??= { entries: new Map(), generation: 0 };
  return g.ohmsteadBearerCache;
}

/** Drops every cached token → actor entry (after a revocation, role or status change). */
export function forgetCachedBearers(): void {
  const c = cache();
  c.entries.clear();
  c.generation++;
}

/** `resolveBearer` for the route guard, through the short-lived cache described above. */
export async function resolveBearerCached(token: string): Promise<Actor | null> {
  const t = token.trim();
  if (!TOKEN_PATTERN.test(t)) return null;
  const c = cache();
  const key = hashToken(t);
  const hit = c.entries.get(key);
  if (hit && hit.until > Date.now()) return { ...hit.actor };
  if (hit) c.entries.delete(key);
  const generation = c.generation;
  const actor = await lookupBearer(key);
  if (!actor || generation !== c.generation) return actor;
  const now = Date.now();
  if (c.entries.size >= TOKEN_CACHE_MAX) {
    for (const [k, v] of c.entries) if (v.until <= now) c.entries.delete(k);
    if (c.entries.size >= TOKEN_CACHE_MAX) c.entries.clear();
  }
  c.entries.set(key, { actor: { ...actor }, until: now + TOKEN_CACHE_TTL_MS });
  return actor;
}

let installed = false;
/**
 * Makes `guardedRoute` accept `Authorization: Bearer ohm_…`. Runs when this module is
 * first imported; importing the module (or calling this) once per server process is enough.
 */
export function installBearerResolver(): void {
  if (installed) return;
  registerBearerResolver(resolveBearerCached);
  installed = true;
}
installBearerResolver();
