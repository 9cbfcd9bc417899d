import { char, datetime, index, mysqlTable, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { users } from "./users";

/** Personal API tokens: only the SHA-256 of the secret is stored; the prefix identifies it in lists. */
export const apiTokens = mysqlTable(
  "api_tokens",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    userId: ref("user_id")
      .notNull()
      .references(() => users.id),
    name: varchar("name", { length: 80 }).notNull(),
    prefix: varchar("prefix", { length: 16 }).notNull(),
    tokenHash: char("token_hash", { length: 64 }).notNull(),
    lastUsedAt: datetime("last_used_at", { fsp: 3 }),
    revokedAt: datetime("revoked_at", { fsp: 3 }),
    createdAt: timestamps.createdAt,
  },
  (t) => [
    uniqueIndex("api_tokens_hash_uq").on(t.tokenHash),
    index("api_tokens_organisation_idx").on(t.organisationId),
    index("api_tokens_user_idx").on(t.userId),
  ],
);
