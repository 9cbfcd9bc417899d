CREATE TABLE `organisations` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`name` varchar(160) NOT NULL,
	`slug` varchar(80) NOT NULL,
	`revision_scheme` enum('letter','number') NOT NULL DEFAULT 'letter',
	`logo_upload_id` int unsigned,
	`settings` json NOT NULL DEFAULT ('{}'),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `organisations_id` PRIMARY KEY(`id`),
	CONSTRAINT `organisations_slug_uq` UNIQUE(`slug`)
);
--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`email` varchar(254) NOT NULL,
	`role` enum('admin','lead','engineer','viewer') NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`invited_by_id` int unsigned NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`accepted_at` datetime(3),
	`revoked_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `invitations_id` PRIMARY KEY(`id`),
	CONSTRAINT `invitations_token_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `sign_in_attempts` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`ip` varchar(64),
	`outcome` enum('success','failure') NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sign_in_attempts_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(255) NOT NULL,
	`role` enum('admin','lead','engineer','viewer') NOT NULL,
	`status` enum('active','deactivated') NOT NULL DEFAULT 'active',
	`last_sign_in_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_uq` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `projects` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`code` varchar(40) NOT NULL,
	`name` varchar(160) NOT NULL,
	`client` varchar(160) NOT NULL DEFAULT '',
	`site` varchar(160) NOT NULL DEFAULT '',
	`system_voltage_v` double NOT NULL,
	`system_type` enum('3ph-4w','3ph-3w','1ph','dc') NOT NULL,
	`frequency_hz` int NOT NULL,
	`earthing` enum('TN-S','TN-C-S','TT','IT') NOT NULL,
	`design_ambient_c` double NOT NULL,
	`altitude_m` double NOT NULL DEFAULT 0,
	`standard_family` enum('iec','north-american') NOT NULL,
	`unit_system` enum('metric','imperial') NOT NULL,
	`notes` text NOT NULL DEFAULT (''),
	`archived_at` datetime(3),
	`created_by_id` int unsigned NOT NULL,
	`version` int unsigned NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `projects_id` PRIMARY KEY(`id`),
	CONSTRAINT `projects_org_code_uq` UNIQUE(`organisation_id`,`code`)
);
--> statement-breakpoint
CREATE TABLE `sheet_revisions` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`sheet_id` int unsigned NOT NULL,
	`ordinal` int unsigned NOT NULL,
	`label` varchar(8) NOT NULL,
	`status` enum('draft','in_review','returned','approved','superseded') NOT NULL DEFAULT 'draft',
	`inputs` json NOT NULL,
	`results` json,
	`engine_version` varchar(20) NOT NULL,
	`content_hash` char(64) NOT NULL,
	`author_id` int unsigned NOT NULL,
	`checked_by_id` int unsigned,
	`submitted_at` datetime(3),
	`decided_at` datetime(3),
	`review_comment` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sheet_revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `sheet_revisions_sheet_ordinal_uq` UNIQUE(`sheet_id`,`ordinal`)
);
--> statement-breakpoint
CREATE TABLE `sheets` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`project_id` int unsigned NOT NULL,
	`kind` varchar(40) NOT NULL,
	`tag` varchar(40) NOT NULL,
	`title` varchar(200) NOT NULL,
	`position` int NOT NULL DEFAULT 0,
	`version` int unsigned NOT NULL DEFAULT 1,
	`created_by_id` int unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sheets_id` PRIMARY KEY(`id`),
	CONSTRAINT `sheets_project_tag_uq` UNIQUE(`project_id`,`tag`)
);
--> statement-breakpoint
CREATE TABLE `audit_events` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`actor_id` int unsigned,
	`event` enum('user.invited','user.invite_revoked','user.joined','user.role_changed','user.deactivated','user.reactivated','user.signed_in','project.created','project.updated','project.archived','project.restored','sheet.created','sheet.saved','sheet.submitted','sheet.approved','sheet.returned','sheet.revised','sheet.superseded','organisation.updated','organisation.logo_uploaded','token.created','token.revoked','package.issued') NOT NULL,
	`entity_type` varchar(40) NOT NULL,
	`entity_id` int unsigned,
	`details` json NOT NULL DEFAULT ('{}'),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `audit_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`kind` enum('logo','package','cable-schedule','ampacity-table') NOT NULL,
	`filename` varchar(200) NOT NULL,
	`content_type` varchar(100) NOT NULL,
	`size_bytes` int unsigned NOT NULL,
	`sha256` char(64) NOT NULL,
	`data` longblob NOT NULL,
	`created_by_id` int unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `uploads_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned,
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(250) NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text,
	`status` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` int unsigned NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`last_error` text,
	`sent_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `mail_outbox_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_invited_by_id_users_id_fk` FOREIGN KEY (`invited_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `projects` ADD CONSTRAINT `projects_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `projects` ADD CONSTRAINT `projects_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheet_revisions` ADD CONSTRAINT `sheet_revisions_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheet_revisions` ADD CONSTRAINT `sheet_revisions_sheet_id_sheets_id_fk` FOREIGN KEY (`sheet_id`) REFERENCES `sheets`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheet_revisions` ADD CONSTRAINT `sheet_revisions_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheet_revisions` ADD CONSTRAINT `sheet_revisions_checked_by_id_users_id_fk` FOREIGN KEY (`checked_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheets` ADD CONSTRAINT `sheets_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheets` ADD CONSTRAINT `sheets_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheets` ADD CONSTRAINT `sheets_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_events` ADD CONSTRAINT `audit_events_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_events` ADD CONSTRAINT `audit_events_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `mail_outbox` ADD CONSTRAINT `mail_outbox_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `invitations_organisation_idx` ON `invitations` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `invitations_invited_by_idx` ON `invitations` (`invited_by_id`);--> statement-breakpoint
CREATE INDEX `invitations_email_idx` ON `invitations` (`email`);--> statement-breakpoint
CREATE INDEX `sign_in_attempts_email_time_idx` ON `sign_in_attempts` (`email`,`created_at`);--> statement-breakpoint
CREATE INDEX `users_organisation_idx` ON `users` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `projects_organisation_idx` ON `projects` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `projects_created_by_idx` ON `projects` (`created_by_id`);--> statement-breakpoint
CREATE INDEX `sheet_revisions_organisation_idx` ON `sheet_revisions` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `sheet_revisions_sheet_idx` ON `sheet_revisions` (`sheet_id`);--> statement-breakpoint
CREATE INDEX `sheet_revisions_author_idx` ON `sheet_revisions` (`author_id`);--> statement-breakpoint
CREATE INDEX `sheet_revisions_checked_by_idx` ON `sheet_revisions` (`checked_by_id`);--> statement-breakpoint
CREATE INDEX `sheet_revisions_hash_idx` ON `sheet_revisions` (`content_hash`);--> statement-breakpoint
CREATE INDEX `sheets_organisation_idx` ON `sheets` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `sheets_project_idx` ON `sheets` (`project_id`);--> statement-breakpoint
CREATE INDEX `sheets_created_by_idx` ON `sheets` (`created_by_id`);--> statement-breakpoint
CREATE INDEX `audit_events_organisation_idx` ON `audit_events` (`organisation_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `audit_events_actor_idx` ON `audit_events` (`actor_id`);--> statement-breakpoint
CREATE INDEX `audit_events_entity_idx` ON `audit_events` (`entity_type`,`entity_id`);--> statement-breakpoint
CREATE INDEX `uploads_organisation_idx` ON `uploads` (`organisation_id`,`kind`);--> statement-breakpoint
CREATE INDEX `uploads_created_by_idx` ON `uploads` (`created_by_id`);--> statement-breakpoint
CREATE INDEX `uploads_sha256_idx` ON `uploads` (`sha256`);--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `mail_outbox_organisation_idx` ON `mail_outbox` (`organisation_id`);