ALTER TABLE `outbox` ADD `claim_token` varchar(36);--> statement-breakpoint
ALTER TABLE `outbox` ADD `claimed_until` datetime(3);