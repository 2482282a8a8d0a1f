ALTER TABLE `source` ADD `author_list` text;--> statement-breakpoint
ALTER TABLE `source` ADD `editor_list` text;--> statement-breakpoint
ALTER TABLE `source` ADD `volume` text;--> statement-breakpoint
ALTER TABLE `source` ADD `issue` text;--> statement-breakpoint
ALTER TABLE `source` ADD `pages` text;--> statement-breakpoint
ALTER TABLE `source` ADD `article_number` text;--> statement-breakpoint
ALTER TABLE `source` ADD `publisher` text;--> statement-breakpoint
ALTER TABLE `source` ADD `accessed_on` text;--> statement-breakpoint
ALTER TABLE `source` ADD `note` text;--> statement-breakpoint
ALTER TABLE `source` ADD `gaps` text DEFAULT '[]' NOT NULL;