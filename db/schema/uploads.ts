import { char, customType, index, int, mysqlEnum, mysqlTable, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { users } from "./users";

const longblob = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => "longblob",
});

export const UPLOAD_KINDS = ["logo", "package", "cable-schedule", "ampacity-table"] as const;
export type UploadKind = (typeof UPLOAD_KINDS)[number];

/** Files kept byte for byte with their hash (logos, issued packages, uploaded CSVs). */
export const uploads = mysqlTable(
  "uploads",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    kind: mysqlEnum("kind", UPLOAD_KINDS).notNull(),
    filename: varchar("filename", { length: 200 }).notNull(),
    contentType: varchar("content_type", { length: 100 }).notNull(),
    sizeBytes: int("size_bytes", { unsigned: true }).notNull(),
    sha256: char("sha256", { length: 64 }).notNull(),
    data: longblob("data").notNull(),
    createdById: ref("created_by_id")
      .notNull()
      .references(() => users.id),
    createdAt: timestamps.createdAt,
  },
  (t) => [
    index("uploads_organisation_idx").on(t.organisationId, t.kind),
    index("uploads_created_by_idx").on(t.createdById),
    index("uploads_sha256_idx").on(t.sha256),
  ],
);
