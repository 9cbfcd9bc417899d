import { boolean, char, datetime, index, int, json, mysqlTable, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { uploads } from "./uploads";
import { users } from "./users";

/**
 * One version of an organisation's ampacity table (the table of the code it works to).
 * Uploading a table under a name already used adds the next version; earlier versions
 * stay readable because sheets and schedules name the version they used.
 */
export const ampacityTables = mysqlTable(
  "ampacity_tables",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    name: varchar("name", { length: 120 }).notNull(),
    /** 1, 2, 3 … per (organisation, name). */
    version: int("version", { unsigned: true }).notNull(),
    /** Where the values come from, as the admin wrote it (code, edition, table). */
    source: varchar("source", { length: 500 }).notNull().default(""),
    /** Validated rows in SI (`ampacityRowSchema` of lib/engine/ampacity-table.ts). */
    rows: json("rows").$type<Record<string, unknown>[]>().notNull(),
    rowCount: int("row_count", { unsigned: true }).notNull(),
    /** The CSV as uploaded, byte for byte. */
    uploadId: ref("upload_id")
      .notNull()
      .references(() => uploads.id),
    /** SHA-256 of the uploaded file. */
    fileSha256: char("file_sha256", { length: 64 }).notNull(),
    /** False once an admin retires the version: no longer offered for new work. */
    active: boolean("active").notNull().default(true),
    retiredAt: datetime("retired_at", { fsp: 3 }),
    createdById: ref("created_by_id")
      .notNull()
      .references(() => users.id),
    createdAt: timestamps.createdAt,
  },
  (t) => [
    uniqueIndex("ampacity_tables_name_version_uq").on(t.organisationId, t.name, t.version),
    index("ampacity_tables_upload_idx").on(t.uploadId),
    index("ampacity_tables_created_by_idx").on(t.createdById),
  ],
);
