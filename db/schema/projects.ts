import { datetime, double, index, int, mysqlEnum, mysqlTable, text, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { users } from "./users";

export const SYSTEM_TYPES = ["3ph-4w", "3ph-3w", "1ph", "dc"] as const;
export type SystemType = (typeof SYSTEM_TYPES)[number];
export const EARTHING_ARRANGEMENTS = ["TN-S", "TN-C-S", "TT", "IT"] as const;
export const STANDARD_FAMILIES = ["iec", "north-american"] as const;
export type StandardFamily = (typeof STANDARD_FAMILIES)[number];
export const UNIT_SYSTEMS = ["metric", "imperial"] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

export const projects = mysqlTable(
  "projects",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    code: varchar("code", { length: 40 }).notNull(),
    name: varchar("name", { length: 160 }).notNull(),
    client: varchar("client", { length: 160 }).notNull().default(""),
    site: varchar("site", { length: 160 }).notNull().default(""),
    systemVoltage: double("system_voltage_v").notNull(),
    systemType: mysqlEnum("system_type", SYSTEM_TYPES).notNull(),
    /** 50 or 60 Hz; 0 for DC. */
    frequency: int("frequency_hz").notNull(),
    earthing: mysqlEnum("earthing", EARTHING_ARRANGEMENTS).notNull(),
    designAmbient: double("design_ambient_c").notNull(),
    altitude: double("altitude_m").notNull().default(0),
    standardFamily: mysqlEnum("standard_family", STANDARD_FAMILIES).notNull(),
    unitSystem: mysqlEnum("unit_system", UNIT_SYSTEMS).notNull(),
    notes: text("notes").notNull().default(""),
    archivedAt: datetime("archived_at", { fsp: 3 }),
    createdById: ref("created_by_id")
      .notNull()
      .references(() => users.id),
    version: int("version", { unsigned: true }).notNull().default(1),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("projects_org_code_uq").on(t.organisationId, t.code),
    index("projects_organisation_idx").on(t.organisationId),
    index("projects_created_by_idx").on(t.createdById),
  ],
);
