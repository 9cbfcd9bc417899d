// The benchmarks' own organisation and users in the database of .env.local, created
// idempotently, so their projects and sheets never show up in the demo organisation.
// Each run gives the users a fresh random password and the engineer a fresh API token
// (earlier bench tokens are revoked), so no secret outlives the run that printed it.
import { randomBytes } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { closeDb, db } from "../../db/client";
import { apiTokens, organisations, users, type Role } from "../../db/schema";
import { audit } from "../../lib/audit";
import { hashPassword } from "../../lib/auth/password";
import { sha256Hex } from "../../lib/hash";
import { loadEnvFile } from "../../scripts/load-env";

export const BENCH_ORGANISATION = { name: "Bench workshop (npm run bench)", slug: "ohmstead-bench" } as const;
export const BENCH_TOKEN_NAME = "npm run bench";

export interface BenchUser {
  id: number;
  email: string;
  password: string;
  role: Role;
}

export interface BenchActors {
  organisationId: number;
  engineer: BenchUser;
  lead: BenchUser;
  admin: BenchUser;
  /** Bearer token of the engineer (`ohm_…`), valid until the next run revokes it. */
  token: string;
}

const BENCH_USERS = [
  { key: "engineer", email: "bench@ohmstead-bench.example", name: "Bench Engineer", role: "engineer" },
  { key: "lead", email: "bench-lead@ohmstead-bench.example", name: "Bench Lead", role: "lead" },
  { key: "admin", email: "bench-admin@ohmstead-bench.example", name: "Bench Administrator", role: "admin" },
] as const;

async function ensureOrganisation(): Promise<number> {
  const find = () => db().select({ id: organisations.id }).from(organisations).where(eq(organisations.slug, BENCH_ORGANISATION.slug)).limit(1);
  const [found] = await find();
  if (found) return found.id;
  await db()
    .insert(organisations)
    .values({ ...BENCH_ORGANISATION })
    .onDuplicateKeyUpdate({ set: { slug: BENCH_ORGANISATION.slug } });
  const [made] = await find();
  if (!made) throw new Error("bench: the bench organisation could not be created");
  return made.id;
}

async function ensureUser(organisationId: number, u: (typeof BENCH_USERS)[number]): Promise<BenchUser> {
  const password = `bench-${randomBytes(18).toString("base64url")}`;
  const passwordHash = await hashPassword(password);
  const [existing] = await db().select({ id: users.id, organisationId: users.organisationId }).from(users).where(eq(users.email, u.email)).limit(1);
  if (existing) {
    if (existing.organisationId !== organisationId) throw new Error(`bench: ${u.email} belongs to another organisation; remove it or change the bench e-mails`);
    await db().update(users).set({ passwordHash, role: u.role, status: "active" }).where(eq(users.id, existing.id));
    return { id: existing.id, email: u.email, password, role: u.role };
  }
  const [row] = await db().insert(users).values({ organisationId, email: u.email, name: u.name, role: u.role, passwordHash }).$returningId();
  return { id: row!.id, email: u.email, password, role: u.role };
}

/** A new API token for the user; the user's earlier bench tokens are revoked in the same transaction. */
async function freshToken(organisationId: number, userId: number): Promise<string> {
  const token = `ohm_${randomBytes(32).toString("base64url")}`;
  const prefix = token.slice(0, 12);
  await db().transaction(async (tx) => {
    const old = await tx
      .select({ id: apiTokens.id, prefix: apiTokens.prefix })
      .from(apiTokens)
      .where(and(eq(apiTokens.organisationId, organisationId), eq(apiTokens.userId, userId), eq(apiTokens.name, BENCH_TOKEN_NAME), isNull(apiTokens.revokedAt)));
    for (const t of old) {
      await tx.update(apiTokens).set({ revokedAt: new Date() }).where(and(eq(apiTokens.organisationId, organisationId), eq(apiTokens.id, t.id)));
      await audit(tx, { organisationId, actorId: userId, event: "token.revoked", entityType: "api_token", entityId: t.id, details: { name: BENCH_TOKEN_NAME, prefix: t.prefix } });
    }
    const [row] = await tx.insert(apiTokens).values({ organisationId, userId, name: BENCH_TOKEN_NAME, prefix, tokenHash: sha256Hex(token) }).$returningId();
    await audit(tx, { organisationId, actorId: userId, event: "token.created", entityType: "api_token", entityId: row!.id, details: { name: BENCH_TOKEN_NAME, prefix } });
  });
  return token;
}

/**
 * The bench organisation, its engineer, lead and administrator with passwords for this run,
 * and an API token of the engineer. Uses the database of .env.local (the one
 * `next start` uses); closes this process's pool when done.
 */
export async function prepareBenchActors(): Promise<BenchActors> {
  loadEnvFile();
  try {
    const organisationId = await ensureOrganisation();
    const engineer = await ensureUser(organisationId, BENCH_USERS[0]);
    const lead = await ensureUser(organisationId, BENCH_USERS[1]);
    const admin = await ensureUser(organisationId, BENCH_USERS[2]);
    const token = await freshToken(organisationId, engineer.id);
    return { organisationId, engineer, lead, admin, token };
  } finally {
    await closeDb();
  }
}
