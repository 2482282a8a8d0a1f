CREATE INDEX `calculation_material_idx` ON `calculation` (`workspace_id`,`material_id`,`quantity`);--> statement-breakpoint
CREATE INDEX `calculation_source_idx` ON `calculation` (`workspace_id`,`source_id`);--> statement-breakpoint
CREATE INDEX `measurement_source_idx` ON `measurement` (`workspace_id`,`source_id`);