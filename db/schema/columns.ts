import { datetime, int } from "drizzle-orm/mysql-core";
import { sql } from "drizzle-orm";

/** Primary key used by every table. */
export const id = () => int("id", { unsigned: true }).autoincrement().primaryKey();

/** Foreign-key column type matching `id()`. */
export const ref = (name: string) => int(name, { unsigned: true });

/** Lifecycle dates (UTC, millisecond precision). */
export const timestamps = {
  createdAt: datetime("created_at", { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  updatedAt: datetime("updated_at", { fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`)
    .$onUpdateFn(() => new Date()),
};
