ALTER TABLE `applications` ADD `received_at` datetime(3);--> statement-breakpoint
CREATE INDEX `applications_queue_received_idx` ON `applications` (`state`,`received_at`,`id`);--> statement-breakpoint
CREATE INDEX `applications_examiner_received_idx` ON `applications` (`assigned_examiner_id`,`state`,`received_at`,`id`);