import { char, datetime, index, int, json, mysqlEnum, mysqlTable, text, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { projects } from "./projects";
import { users } from "./users";

export const SHEET_STATUSES = ["draft", "in_review", "returned", "approved", "superseded"] as const;
export type SheetStatus = (typeof SHEET_STATUSES)[number];

/** A calculation sheet: its identity in the project. Its content lives in revisions. */
export const sheets = mysqlTable(
  "sheets",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    projectId: ref("project_id")
      .notNull()
      .references(() => projects.id),
    kind: varchar("kind", { length: 40 }).notNull(),
    tag: varchar("tag", { length: 40 }).notNull(),
    title: varchar("title", { length: 200 }).notNull(),
    position: int("position").notNull().default(0),
    /** Optimistic lock: every write checks and increments it. */
    version: int("version", { unsigned: true }).notNull().default(1),
    createdById: ref("created_by_id")
      .notNull()
      .references(() => users.id),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("sheets_project_tag_uq").on(t.projectId, t.tag),
    index("sheets_organisation_idx").on(t.organisationId),
    index("sheets_project_idx").on(t.projectId),
    index("sheets_created_by_idx").on(t.createdById),
  ],
);

/** One revision of a sheet: inputs, the authoritative results and the review state. */
export const sheetRevisions = mysqlTable(
  "sheet_revisions",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    sheetId: ref("sheet_id")
      .notNull()
      .references(() => sheets.id),
    /** 0-based ordinal; the label (A, B … or 0, 1 …) follows the organisation's scheme. */
    ordinal: int("ordinal", { unsigned: true }).notNull(),
    label: varchar("label", { length: 8 }).notNull(),
    status: mysqlEnum("status", SHEET_STATUSES).notNull().default("draft"),
    inputs: json("inputs").$type<Record<string, unknown>>().notNull(),
    results: json("results").$type<Record<string, unknown> | null>(),
    engineVersion: varchar("engine_version", { length: 20 }).notNull(),
    /** SHA-256 over the canonical JSON of inputs and results. */
    contentHash: char("content_hash", { length: 64 }).notNull(),
    authorId: ref("author_id")
      .notNull()
      .references(() => users.id),
    checkedById: ref("checked_by_id").references(() => users.id),
    submittedAt: datetime("submitted_at", { fsp: 3 }),
    decidedAt: datetime("decided_at", { fsp: 3 }),
    reviewComment: text("review_comment"),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("sheet_revisions_sheet_ordinal_uq").on(t.sheetId, t.ordinal),
    index("sheet_revisions_organisation_idx").on(t.organisationId),
    index("sheet_revisions_sheet_idx").on(t.sheetId),
    index("sheet_revisions_author_idx").on(t.authorId),
    index("sheet_revisions_checked_by_idx").on(t.checkedById),
    index("sheet_revisions_hash_idx").on(t.contentHash),
  ],
);
