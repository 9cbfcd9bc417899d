import { char, index, int, json, mysqlTable, varchar } from "drizzle-orm/mysql-core";
import { ampacityTables } from "./ampacity";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { projects } from "./projects";
import { uploads } from "./uploads";
import { users } from "./users";

/**
 * One uploaded cable schedule of a project: the file kept with its hash beside the
 * per-row results and the row errors. The newest schedule of a project is its current
 * one (shown on the project page and put in the calculation package).
 */
export const cableSchedules = mysqlTable(
  "cable_schedules",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    projectId: ref("project_id")
      .notNull()
      .references(() => projects.id),
    uploadId: ref("upload_id")
      .notNull()
      .references(() => uploads.id),
    filename: varchar("filename", { length: 200 }).notNull(),
    /** SHA-256 of the uploaded file. */
    fileSha256: char("file_sha256", { length: 64 }).notNull(),
    /** The organisation ampacity table version used, when the rows referred to one. */
    ampacityTableId: ref("ampacity_table_id").references(() => ampacityTables.id),
    /** Options the schedule was computed with (drop limit, conductor temperature basis …). */
    options: json("options").$type<Record<string, unknown>>().notNull().default({}),
    rowCount: int("row_count", { unsigned: true }).notNull(),
    validCount: int("valid_count", { unsigned: true }).notNull(),
    failCount: int("fail_count", { unsigned: true }).notNull(),
    /** Computed rows (one object per valid row, SI). */
    results: json("results").$type<Record<string, unknown>[]>().notNull(),
    /** Row and column errors in plain words: { row, column, message }. */
    errors: json("errors").$type<Record<string, unknown>[]>().notNull(),
    engineVersion: varchar("engine_version", { length: 20 }).notNull(),
    /** SHA-256 over the canonical JSON of options and results. */
    resultsHash: char("results_hash", { length: 64 }).notNull(),
    createdById: ref("created_by_id")
      .notNull()
      .references(() => users.id),
    createdAt: timestamps.createdAt,
  },
  (t) => [
    index("cable_schedules_project_idx").on(t.projectId, t.createdAt),
    index("cable_schedules_organisation_idx").on(t.organisationId),
    index("cable_schedules_upload_idx").on(t.uploadId),
    index("cable_schedules_table_idx").on(t.ampacityTableId),
    index("cable_schedules_created_by_idx").on(t.createdById),
  ],
);
