CREATE TABLE `deflection_checks` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`cycle` int NOT NULL,
	`purpose` enum('review','precheck') NOT NULL,
	`member_mark` varchar(40) NOT NULL,
	`sheet_id` bigint unsigned,
	`calc_document_id` bigint unsigned,
	`calc_page` int,
	`model` json NOT NULL,
	`options` json NOT NULL,
	`solver_version` varchar(40) NOT NULL,
	`result` json NOT NULL,
	`verdict` enum('pass','fail','near_limit','disputed','no_limit') NOT NULL,
	`summary` varchar(500) NOT NULL,
	`status` enum('current','reverify') NOT NULL DEFAULT 'current',
	`created_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`version` int NOT NULL DEFAULT 1,
	CONSTRAINT `deflection_checks_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `holidays` (
	`day` varchar(10) NOT NULL,
	`name` varchar(80) NOT NULL,
	CONSTRAINT `holidays_day` PRIMARY KEY(`day`)
);
--> statement-breakpoint
CREATE TABLE `reminders_sent` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`cycle` int NOT NULL,
	`kind` enum('due_tomorrow','overdue') NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `reminders_sent_id` PRIMARY KEY(`id`),
	CONSTRAINT `reminders_once_uq` UNIQUE(`application_id`,`cycle`,`kind`)
);
--> statement-breakpoint
CREATE TABLE `settings` (
	`key` varchar(64) NOT NULL,
	`value` json NOT NULL,
	`updated_by` bigint unsigned,
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `settings_key` PRIMARY KEY(`key`)
);
--> statement-breakpoint
ALTER TABLE `applications` ADD `due_at` datetime(3);--> statement-breakpoint
ALTER TABLE `review_cycles` ADD `due_at` datetime(3);--> statement-breakpoint
ALTER TABLE `deflection_checks` ADD CONSTRAINT `deflection_checks_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `deflection_checks` ADD CONSTRAINT `deflection_checks_sheet_id_sheets_id_fk` FOREIGN KEY (`sheet_id`) REFERENCES `sheets`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `deflection_checks` ADD CONSTRAINT `deflection_checks_calc_document_id_documents_id_fk` FOREIGN KEY (`calc_document_id`) REFERENCES `documents`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `deflection_checks` ADD CONSTRAINT `deflection_checks_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `reminders_sent` ADD CONSTRAINT `reminders_sent_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `settings` ADD CONSTRAINT `settings_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `checks_app_idx` ON `deflection_checks` (`application_id`,`cycle`);--> statement-breakpoint
CREATE INDEX `checks_calc_idx` ON `deflection_checks` (`calc_document_id`);--> statement-breakpoint
CREATE INDEX `applications_queue_due_idx` ON `applications` (`state`,`due_at`,`id`);--> statement-breakpoint
CREATE INDEX `applications_examiner_due_idx` ON `applications` (`assigned_examiner_id`,`state`,`due_at`,`id`);