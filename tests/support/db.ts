import { db, pool } from "@/db/client";
import { organisations, users, type Role, type UserStatus } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";

/** Helpers for integration tests against the test database (`<DB_NAME>_test`). */

/** Empties every table (migrations bookkeeping excepted). Refuses to run on a non-test database. */
export async function resetDb(): Promise<void> {
  const conn = await pool().getConnection();
  try {
    const [[current]] = (await conn.query("SELECT DATABASE() AS name")) as unknown as [[{ name: string | null }]];
    if (!current?.name?.endsWith("_test")) throw new Error(`resetDb: refusing to empty "${current?.name}" (not a _test database)`);
    const [tables] = (await conn.query(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND table_name NOT LIKE '\\_\\_drizzle%'",
    )) as unknown as [{ t: string }[]];
    // Foreign keys off for this connection only, so the order of truncation does not matter.
    await conn.query("SET FOREIGN_KEY_CHECKS = 0");
    try {
      for (const { t } of tables) await conn.query(`TRUNCATE TABLE \`${t.replace(/`/g, "")}\``);
    } finally {
      await conn.query("SET FOREIGN_KEY_CHECKS = 1");
    }
  } finally {
    conn.release();
  }
}

let seq = 0;
const next = () => `${Date.now().toString(36)}${(++seq).toString(36)}`;

export interface TestOrg {
  id: number;
  name: string;
  slug: string;
}

export async function makeOrg(name: string): Promise<TestOrg> {
  const slug = `${name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60)}-${next()}`;
  const [row] = await db().insert(organisations).values({ name, slug }).$returningId();
  if (!row) throw new Error("makeOrg: no id");
  return { id: row.id, name, slug };
}

export const DEFAULT_TEST_PASSWORD = "correct-battery-staple-42";

const hashes = new Map<string, Promise<string>>();
function cachedHash(password: string) {
  let h = hashes.get(password);
  if (!h) hashes.set(password, (h = hashPassword(password)));
  return h;
}

/** A user as the tests need it: the Actor fields plus the plain password. */
export interface TestUser {
  id: number;
  organisationId: number;
  role: Role;
  name: string;
  email: string;
  password: string;
}

export async function makeUser(
  organisationId: number,
  role: Role,
  overrides: { email?: string; name?: string; password?: string; status?: UserStatus } = {},
): Promise<TestUser> {
  const email = (overrides.email ?? `${role}-${next()}@example.test`).toLowerCase();
  const name = overrides.name ?? `Test ${role[0]!.toUpperCase()}${role.slice(1)} ${seq}`;
  const password = overrides.password ?? DEFAULT_TEST_PASSWORD;
  const [row] = await db()
    .insert(users)
    .values({ organisationId, email, name, role, passwordHash: await cachedHash(password), status: overrides.status ?? "active" })
    .$returningId();
  if (!row) throw new Error("makeUser: no id");
  return { id: row.id, organisationId, role, name, email, password };
}
