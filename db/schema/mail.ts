import { datetime, index, int, mysqlEnum, mysqlTable, text, varchar } from "drizzle-orm/mysql-core";
import { sql } from "drizzle-orm";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";

export const MAIL_STATUSES = ["pending", "sent", "failed"] as const;

/**
 * Transactional outbox: a request writes its mail here in its own transaction; the
 * sender claims rows with SELECT … FOR UPDATE SKIP LOCKED and marks them sent.
 */
export const mailOutbox = mysqlTable(
  "mail_outbox",
  {
    id: id(),
    organisationId: ref("organisation_id").references(() => organisations.id),
    toAddress: varchar("to_address", { length: 254 }).notNull(),
    subject: varchar("subject", { length: 250 }).notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body"),
    status: mysqlEnum("status", MAIL_STATUSES).notNull().default("pending"),
    attempts: int("attempts", { unsigned: true }).notNull().default(0),
    nextAttemptAt: datetime("next_attempt_at", { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    lastError: text("last_error"),
    sentAt: datetime("sent_at", { fsp: 3 }),
    ...timestamps,
  },
  (t) => [index("mail_outbox_due_idx").on(t.status, t.nextAttemptAt), index("mail_outbox_organisation_idx").on(t.organisationId)],
);
