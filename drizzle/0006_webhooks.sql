DROP INDEX `mail_outbox_due_idx`;--> statement-breakpoint
ALTER TABLE `mail_outbox` ADD `channel` text DEFAULT 'email' NOT NULL;--> statement-breakpoint
ALTER TABLE `mail_outbox` ADD `watch_id` text;--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`channel`,`status`,`next_attempt_at`);--> statement-breakpoint
ALTER TABLE `workspace_settings` ADD `allow_private_webhook_targets` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `watch` ADD `webhook_url` text;--> statement-breakpoint
ALTER TABLE `watch` ADD `webhook_secret` text;--> statement-breakpoint
ALTER TABLE `watch` ADD `webhook_secret_created_at` integer;