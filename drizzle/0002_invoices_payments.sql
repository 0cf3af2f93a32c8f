CREATE TABLE `invoices` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`application_id` bigint unsigned NOT NULL,
	`number` varchar(24),
	`purpose` varchar(40) NOT NULL,
	`cycle` int NOT NULL,
	`status` enum('open','paid','void','refunded') NOT NULL DEFAULT 'open',
	`total_cents` bigint NOT NULL,
	`currency` char(3) NOT NULL DEFAULT 'usd',
	`line_items` json NOT NULL,
	`schedule_version` varchar(40) NOT NULL,
	`provider_session_id` varchar(255),
	`provider_payment_id` varchar(255),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`paid_at` datetime(3),
	`closed_at` datetime(3),
	`version` int NOT NULL DEFAULT 1,
	CONSTRAINT `invoices_id` PRIMARY KEY(`id`),
	CONSTRAINT `invoices_number_uq` UNIQUE(`number`),
	CONSTRAINT `invoices_app_purpose_cycle_uq` UNIQUE(`application_id`,`purpose`,`cycle`)
);
--> statement-breakpoint
CREATE TABLE `payment_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`provider_event_id` varchar(255) NOT NULL,
	`type` varchar(80) NOT NULL,
	`invoice_id` bigint unsigned,
	`payload` json NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `payment_events_id` PRIMARY KEY(`id`),
	CONSTRAINT `payment_events_provider_uq` UNIQUE(`provider_event_id`)
);
--> statement-breakpoint
ALTER TABLE `invoices` ADD CONSTRAINT `invoices_application_id_applications_id_fk` FOREIGN KEY (`application_id`) REFERENCES `applications`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment_events` ADD CONSTRAINT `payment_events_invoice_id_invoices_id_fk` FOREIGN KEY (`invoice_id`) REFERENCES `invoices`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `invoices_session_idx` ON `invoices` (`provider_session_id`);