ALTER TABLE `calculation` ADD `temperature_text` text;--> statement-breakpoint
ALTER TABLE `measurement` ADD `temperature_text` text;