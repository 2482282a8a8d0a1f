CREATE TABLE `job` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`key` text NOT NULL,
	`workspace_id` text,
	`payload` text NOT NULL,
	`status` text DEFAULT 'queued' NOT NULL,
	`run_after` integer NOT NULL,
	`generation` integer DEFAULT 1 NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`lease_owner` text,
	`lease_expires_at` integer,
	`last_error` text,
	`last_error_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `job_kind_key_uq` ON `job` (`kind`,`key`);--> statement-breakpoint
CREATE INDEX `job_due_idx` ON `job` (`status`,`run_after`);