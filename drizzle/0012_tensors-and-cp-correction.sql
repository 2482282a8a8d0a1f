ALTER TABLE `material` ADD `thermal_expansion_per_k` real;--> statement-breakpoint
ALTER TABLE `material` ADD `bulk_modulus_gpa` real;--> statement-breakpoint
ALTER TABLE `material` ADD `molar_volume_cm3` real;--> statement-breakpoint
ALTER TABLE `calculation` ADD `site` text;--> statement-breakpoint
ALTER TABLE `calculation` ADD `components` text;--> statement-breakpoint
ALTER TABLE `measurement` ADD `site` text;--> statement-breakpoint
ALTER TABLE `measurement` ADD `components` text;