CREATE TABLE `applications` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`number` varchar(24),
	`applicant_id` bigint unsigned NOT NULL,
	`firm_id` bigint unsigned,
	`state` enum('draft','submitted','returned_incomplete','in_review','corrections_issued','resubmitted','approved','approved_with_conditions','withdrawn') NOT NULL DEFAULT 'draft',
	`cycle` int NOT NULL DEFAULT 0,
	`work_description` varchar(2000) NOT NULL,
	`site_address` varchar(200) NOT NULL,
	`parcel_number` varchar(40) NOT NULL,
	`occupancy_group` varchar(8) NOT NULL,
	`construction_type` varchar(8) NOT NULL,
	`valuation_cents` bigint NOT NULL,
	`dpor_name` varchar(120) NOT NULL,
	`dpor_licence` varchar(40) NOT NULL,
	`assigned_examiner_id` bigint unsigned,
	`conditions` json,
	`return_reasons` json,
	`submitted_at` datetime(3),
	`accepted_at` datetime(3),
	`decided_at` datetime(3),
	`version` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `applications_id` PRIMARY KEY(`id`),
	CONSTRAINT `applications_number_uq` UNIQUE(`number`)
);
--> statement-breakpoint
CREATE TABLE `assignments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`examiner_id` bigint unsigned NOT NULL,
	`assigned_by` bigint unsigned NOT NULL,
	`reason` varchar(500) NOT NULL DEFAULT '',
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`ended_at` datetime(3),
	CONSTRAINT `assignments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `audit_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`actor_id` bigint unsigned,
	`actor_role` varchar(20),
	`action` varchar(64) NOT NULL,
	`entity_type` varchar(32) NOT NULL,
	`entity_id` varchar(64) NOT NULL,
	`application_id` bigint unsigned,
	`summary` varchar(500) NOT NULL,
	`detail` json,
	`ip` varchar(64),
	CONSTRAINT `audit_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `auth_tokens` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`purpose` enum('invite','reset') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `auth_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `auth_tokens_hash_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `comments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`number` int NOT NULL,
	`cycle` int NOT NULL,
	`discipline` varchar(24) NOT NULL,
	`sheet_id` bigint unsigned,
	`pin_x` double,
	`pin_y` double,
	`code_section` varchar(60) NOT NULL,
	`code_edition` varchar(30) NOT NULL,
	`body` text NOT NULL,
	`status` enum('draft','open','resolved') NOT NULL DEFAULT 'draft',
	`check_id` bigint unsigned,
	`created_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`resolved_at` datetime(3),
	`resolved_by` bigint unsigned,
	`version` int NOT NULL DEFAULT 1,
	CONSTRAINT `comments_id` PRIMARY KEY(`id`),
	CONSTRAINT `comments_app_number_uq` UNIQUE(`application_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `documents` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`cycle` int NOT NULL,
	`kind` enum('drawings','calculations','response_letter','member_model') NOT NULL,
	`original_name` varchar(255) NOT NULL,
	`content_type` varchar(80) NOT NULL,
	`byte_size` bigint NOT NULL,
	`sha256` char(64) NOT NULL,
	`page_count` int NOT NULL DEFAULT 0,
	`storage_key` varchar(120) NOT NULL,
	`uploaded_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `documents_id` PRIMARY KEY(`id`),
	CONSTRAINT `documents_app_sha_uq` UNIQUE(`application_id`,`sha256`)
);
--> statement-breakpoint
CREATE TABLE `firms` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`name` varchar(160) NOT NULL,
	`kind` enum('design','contractor','owner') NOT NULL,
	`city` varchar(80) NOT NULL DEFAULT '',
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `firms_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `login_attempts` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`ip` varchar(64) NOT NULL,
	`success` boolean NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `login_attempts_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `outbox` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`dedupe_key` varchar(191) NOT NULL,
	`template` varchar(64) NOT NULL,
	`to_address` varchar(254) NOT NULL,
	`to_name` varchar(120) NOT NULL DEFAULT '',
	`subject` varchar(250) NOT NULL,
	`text_body` text NOT NULL,
	`application_id` bigint unsigned,
	`status` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`last_error` varchar(500),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`sent_at` datetime(3),
	CONSTRAINT `outbox_id` PRIMARY KEY(`id`),
	CONSTRAINT `outbox_dedupe_uq` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
CREATE TABLE `responses` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`comment_id` bigint unsigned NOT NULL,
	`cycle` int NOT NULL,
	`body` text NOT NULL,
	`change_reference` varchar(120) NOT NULL DEFAULT '',
	`document_id` bigint unsigned,
	`verdict` enum('pending','resolved','not_resolved') NOT NULL DEFAULT 'pending',
	`created_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`reviewed_by` bigint unsigned,
	`reviewed_at` datetime(3),
	`version` int NOT NULL DEFAULT 1,
	CONSTRAINT `responses_id` PRIMARY KEY(`id`),
	CONSTRAINT `responses_comment_cycle_uq` UNIQUE(`comment_id`,`cycle`)
);
--> statement-breakpoint
CREATE TABLE `review_cycles` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`number` int NOT NULL,
	`examiner_id` bigint unsigned,
	`received_at` datetime(3) NOT NULL,
	`decided_at` datetime(3),
	`outcome` enum('corrections_issued','approved','approved_with_conditions','withdrawn'),
	`version` int NOT NULL DEFAULT 1,
	CONSTRAINT `review_cycles_id` PRIMARY KEY(`id`),
	CONSTRAINT `review_cycles_app_number_uq` UNIQUE(`application_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `sheets` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`document_id` bigint unsigned NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`page` int NOT NULL,
	`sheet_number` varchar(24),
	`title` varchar(200) NOT NULL,
	CONSTRAINT `sheets_id` PRIMARY KEY(`id`),
	CONSTRAINT `sheets_doc_page_uq` UNIQUE(`document_id`,`page`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`role` enum('applicant','technician','examiner','supervisor','admin') NOT NULL,
	`status` enum('invited','active','deactivated') NOT NULL DEFAULT 'invited',
	`password_hash` varchar(100),
	`session_version` int NOT NULL DEFAULT 1,
	`firm_id` bigint unsigned,
	`title` varchar(120) NOT NULL DEFAULT '',
	`version` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_uq` UNIQUE(`email`)
);
--> statement-breakpoint
ALTER TABLE `applications` ADD CONSTRAINT `applications_applicant_id_users_id_fk` FOREIGN KEY (`applicant_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `applications` ADD CONSTRAINT `applications_firm_id_firms_id_fk` FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `applications` ADD CONSTRAINT `applications_assigned_examiner_id_users_id_fk` FOREIGN KEY (`assigned_examiner_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `assignments` ADD CONSTRAINT `assignments_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `assignments` ADD CONSTRAINT `assignments_examiner_id_users_id_fk` FOREIGN KEY (`examiner_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `assignments` ADD CONSTRAINT `assignments_assigned_by_users_id_fk` FOREIGN KEY (`assigned_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD CONSTRAINT `auth_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD CONSTRAINT `auth_tokens_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `comments` ADD CONSTRAINT `comments_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `comments` ADD CONSTRAINT `comments_sheet_id_sheets_id_fk` FOREIGN KEY (`sheet_id`) REFERENCES `sheets`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `comments` ADD CONSTRAINT `comments_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `comments` ADD CONSTRAINT `comments_resolved_by_users_id_fk` FOREIGN KEY (`resolved_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `documents` ADD CONSTRAINT `documents_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `documents` ADD CONSTRAINT `documents_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `responses` ADD CONSTRAINT `responses_comment_id_comments_id_fk` FOREIGN KEY (`comment_id`) REFERENCES `comments`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `responses` ADD CONSTRAINT `responses_document_id_documents_id_fk` FOREIGN KEY (`document_id`) REFERENCES `documents`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `responses` ADD CONSTRAINT `responses_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `responses` ADD CONSTRAINT `responses_reviewed_by_users_id_fk` FOREIGN KEY (`reviewed_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_cycles` ADD CONSTRAINT `review_cycles_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_cycles` ADD CONSTRAINT `review_cycles_examiner_id_users_id_fk` FOREIGN KEY (`examiner_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheets` ADD CONSTRAINT `sheets_document_id_documents_id_fk` FOREIGN KEY (`document_id`) REFERENCES `documents`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sheets` ADD CONSTRAINT `sheets_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_firm_id_firms_id_fk` FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `applications_applicant_idx` ON `applications` (`applicant_id`,`updated_at`);--> statement-breakpoint
CREATE INDEX `applications_state_idx` ON `applications` (`state`,`submitted_at`,`id`);--> statement-breakpoint
CREATE INDEX `applications_examiner_idx` ON `applications` (`assigned_examiner_id`,`state`,`id`);--> statement-breakpoint
CREATE INDEX `assignments_app_idx` ON `assignments` (`application_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `audit_app_idx` ON `audit_events` (`application_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `audit_action_idx` ON `audit_events` (`action`,`created_at`);--> statement-breakpoint
CREATE INDEX `auth_tokens_user_idx` ON `auth_tokens` (`user_id`,`purpose`);--> statement-breakpoint
CREATE INDEX `comments_app_status_idx` ON `comments` (`application_id`,`status`);--> statement-breakpoint
CREATE INDEX `documents_app_idx` ON `documents` (`application_id`,`cycle`);--> statement-breakpoint
CREATE INDEX `login_attempts_email_idx` ON `login_attempts` (`email`,`created_at`);--> statement-breakpoint
CREATE INDEX `login_attempts_ip_idx` ON `login_attempts` (`ip`,`created_at`);--> statement-breakpoint
CREATE INDEX `outbox_pending_idx` ON `outbox` (`status`,`next_attempt_at`,`id`);--> statement-breakpoint
CREATE INDEX `sheets_app_number_idx` ON `sheets` (`application_id`,`sheet_number`);--> statement-breakpoint
CREATE INDEX `users_role_idx` ON `users` (`role`,`status`);