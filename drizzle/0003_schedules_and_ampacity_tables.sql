CREATE TABLE `ampacity_tables` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`version` int unsigned NOT NULL,
	`source` varchar(500) NOT NULL DEFAULT '',
	`rows` json NOT NULL,
	`row_count` int unsigned NOT NULL,
	`upload_id` int unsigned NOT NULL,
	`file_sha256` char(64) NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`retired_at` datetime(3),
	`created_by_id` int unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `ampacity_tables_id` PRIMARY KEY(`id`),
	CONSTRAINT `ampacity_tables_name_version_uq` UNIQUE(`organisation_id`,`name`,`version`)
);
--> statement-breakpoint
CREATE TABLE `cable_schedules` (
	`id` int unsigned AUTO_INCREMENT NOT NULL,
	`organisation_id` int unsigned NOT NULL,
	`project_id` int unsigned NOT NULL,
	`upload_id` int unsigned NOT NULL,
	`filename` varchar(200) NOT NULL,
	`file_sha256` char(64) NOT NULL,
	`ampacity_table_id` int unsigned,
	`options` json NOT NULL DEFAULT ('{}'),
	`row_count` int unsigned NOT NULL,
	`valid_count` int unsigned NOT NULL,
	`fail_count` int unsigned NOT NULL,
	`results` json NOT NULL,
	`errors` json NOT NULL,
	`engine_version` varchar(20) NOT NULL,
	`results_hash` char(64) NOT NULL,
	`created_by_id` int unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cable_schedules_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `audit_events` MODIFY COLUMN `event` enum('user.invited','user.invite_revoked','user.joined','user.role_changed','user.deactivated','user.reactivated','user.signed_in','project.created','project.updated','project.archived','project.restored','sheet.created','sheet.saved','sheet.submitted','sheet.withdrawn','sheet.approved','sheet.returned','sheet.revised','sheet.superseded','organisation.updated','organisation.logo_uploaded','token.created','token.revoked','package.issued','schedule.uploaded','ampacity_table.uploaded','ampacity_table.retired','ampacity_table.restored','network.imported') NOT NULL;--> statement-breakpoint
ALTER TABLE `ampacity_tables` ADD CONSTRAINT `ampacity_tables_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ampacity_tables` ADD CONSTRAINT `ampacity_tables_upload_id_uploads_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ampacity_tables` ADD CONSTRAINT `ampacity_tables_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cable_schedules` ADD CONSTRAINT `cable_schedules_organisation_id_organisations_id_fk` FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cable_schedules` ADD CONSTRAINT `cable_schedules_project_id_projects_id_fk` FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cable_schedules` ADD CONSTRAINT `cable_schedules_upload_id_uploads_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cable_schedules` ADD CONSTRAINT `cable_schedules_ampacity_table_id_ampacity_tables_id_fk` FOREIGN KEY (`ampacity_table_id`) REFERENCES `ampacity_tables`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cable_schedules` ADD CONSTRAINT `cable_schedules_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `ampacity_tables_upload_idx` ON `ampacity_tables` (`upload_id`);--> statement-breakpoint
CREATE INDEX `ampacity_tables_created_by_idx` ON `ampacity_tables` (`created_by_id`);--> statement-breakpoint
CREATE INDEX `cable_schedules_project_idx` ON `cable_schedules` (`project_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `cable_schedules_organisation_idx` ON `cable_schedules` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `cable_schedules_upload_idx` ON `cable_schedules` (`upload_id`);--> statement-breakpoint
CREATE INDEX `cable_schedules_table_idx` ON `cable_schedules` (`ampacity_table_id`);--> statement-breakpoint
CREATE INDEX `cable_schedules_created_by_idx` ON `cable_schedules` (`created_by_id`);