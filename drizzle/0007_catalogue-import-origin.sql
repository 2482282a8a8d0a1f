ALTER TABLE `material` ADD `import_id` text;--> statement-breakpoint
CREATE INDEX `material_import_idx` ON `material` (`workspace_id`,`import_id`);--> statement-breakpoint
ALTER TABLE `method` ADD `import_id` text;--> statement-breakpoint
CREATE INDEX `method_import_idx` ON `method` (`workspace_id`,`import_id`);--> statement-breakpoint
ALTER TABLE `source` ADD `import_id` text;--> statement-breakpoint
CREATE INDEX `source_import_idx` ON `source` (`workspace_id`,`import_id`);