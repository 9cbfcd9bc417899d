import { json, mysqlEnum, mysqlTable, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";

export const REVISION_SCHEMES = ["letter", "number"] as const;
export type RevisionScheme = (typeof REVISION_SCHEMES)[number];

/** Organisation-level overrides of the engine's default limits (voltage drop, etc.). */
export type OrganisationSettings = {
  voltageDropLimits?: { feederPercent?: number; totalPercent?: number };
};

export const organisations = mysqlTable(
  "organisations",
  {
    id: id(),
    name: varchar("name", { length: 160 }).notNull(),
    slug: varchar("slug", { length: 80 }).notNull(),
    revisionScheme: mysqlEnum("revision_scheme", REVISION_SCHEMES).notNull().default("letter"),
    logoUploadId: ref("logo_upload_id"),
    settings: json("settings").$type<OrganisationSettings>().notNull().default({}),
    ...timestamps,
  },
  (t) => [uniqueIndex("organisations_slug_uq").on(t.slug)],
);
