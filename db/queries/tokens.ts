import "server-only";
import { and, desc, eq, isNull, lt, or } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { apiTokens, users, type Role } from "@/db/schema";

/**
 * Data access for personal API tokens. Only the SHA-256 of a token is stored; the
 * prefix identifies it in lists. Listing and revoking are scoped to the organisation
 * and the owning user.
 */

/** A token as its owner sees it in a list (never the secret or its hash). */
export interface TokenListItem {
  id: number;
  name: string;
  prefix: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

/** Inserts a token and returns its id. */
export async function insertToken(tx: Tx, v: { organisationId: number; userId: number; name: string; prefix: string; tokenHash: string }): Promise<number> {
  const [row] = await tx.insert(apiTokens).values(v).$returningId();
  if (!row) throw new Error("insertToken: no id returned");
  return row.id;
}

/** The user's tokens in the organisation, newest first (revoked ones included). */
export async function listUserTokens(organisationId: number, userId: number): Promise<TokenListItem[]> {
  return db()
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
    })
    .from(apiTokens)
    .where(and(eq(apiTokens.organisationId, organisationId), eq(apiTokens.userId, userId)))
    .orderBy(desc(apiTokens.createdAt), desc(apiTokens.id));
}

/** One of the user's tokens, locked for update, or null. */
export async function lockUserToken(tx: Tx, organisationId: number, userId: number, id: number): Promise<TokenListItem | null> {
  const [row] = await tx
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
    })
    .from(apiTokens)
    .where(and(eq(apiTokens.id, id), eq(apiTokens.organisationId, organisationId), eq(apiTokens.userId, userId)))
    .limit(1)
    .for("update");
  return row ?? null;
}

/** Marks a token revoked. */
export async function markTokenRevoked(tx: Tx, organisationId: number, id: number, at: Date): Promise<void> {
  await tx
    .update(apiTokens)
    .set({ revokedAt: at })
    .where(and(eq(apiTokens.id, id), eq(apiTokens.organisationId, organisationId), isNull(apiTokens.revokedAt)));
}

/** The owner of an unrevoked token whose hash matches, if that user is active in the token's organisation. */
export async function findLiveTokenOwner(
  tokenHash: string,
): Promise<{ tokenId: number; lastUsedAt: Date | null; user: { id: number; organisationId: number; role: Role; name: string; email: string } } | null> {
  const [row] = await db()
    .select({
      tokenId: apiTokens.id,
      lastUsedAt: apiTokens.lastUsedAt,
      id: users.id,
      organisationId: users.organisationId,
      role: users.role,
      name: users.name,
      email: users.email,
    })
    .from(apiTokens)
    .innerJoin(users, and(eq(users.id, apiTokens.userId), eq(users.organisationId, apiTokens.organisationId)))
    .where(and(eq(apiTokens.tokenHash, tokenHash), isNull(apiTokens.revokedAt), eq(users.status, "active")))
    .limit(1);
  if (!row) return null;
  const { tokenId, lastUsedAt, ...user } = row;
  return { tokenId, lastUsedAt, user };
}

/** Sets last_used_at = now unless it was set after `notAfter` (one write a minute at most). */
export async function touchToken(id: number, now: Date, notAfter: Date): Promise<void> {
  await db()
    .update(apiTokens)
    .set({ lastUsedAt: now })
    .where(and(eq(apiTokens.id, id), or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, notAfter))));
}
