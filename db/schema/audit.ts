import { index, json, mysqlEnum, mysqlTable, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";
import { users } from "./users";

export const AUDIT_EVENTS = [
  "user.invited",
  "user.invite_revoked",
  "user.joined",
  "user.role_changed",
  "user.deactivated",
  "user.reactivated",
  "user.signed_in",
  "project.created",
  "project.updated",
  "project.archived",
  "project.restored",
  "sheet.created",
  "sheet.saved",
  "sheet.submitted",
  "sheet.withdrawn",
  "sheet.approved",
  "sheet.returned",
  "sheet.revised",
  "sheet.superseded",
  "organisation.updated",
  "organisation.logo_uploaded",
  "token.created",
  "token.revoked",
  "package.issued",
  "schedule.uploaded",
  "ampacity_table.uploaded",
  "ampacity_table.retired",
  "ampacity_table.restored",
  "network.imported",
] as const;
export type AuditEvent = (typeof AUDIT_EVENTS)[number];

export const auditEvents = mysqlTable(
  "audit_events",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    actorId: ref("actor_id").references(() => users.id),
    event: mysqlEnum("event", AUDIT_EVENTS).notNull(),
    entityType: varchar("entity_type", { length: 40 }).notNull(),
    entityId: ref("entity_id"),
    details: json("details").$type<Record<string, unknown>>().notNull().default({}),
    createdAt: timestamps.createdAt,
  },
  (t) => [
    index("audit_events_organisation_idx").on(t.organisationId, t.createdAt),
    index("audit_events_actor_idx").on(t.actorId),
    index("audit_events_entity_idx").on(t.entityType, t.entityId),
  ],
);
