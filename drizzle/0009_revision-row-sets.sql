ALTER TABLE `calculation` ADD `seq` integer;--> statement-breakpoint
UPDATE `calculation` SET `seq` = rowid;--> statement-breakpoint
CREATE UNIQUE INDEX `calculation_seq_uq` ON `calculation` (`seq`);--> statement-breakpoint
ALTER TABLE `measurement` ADD `seq` integer;--> statement-breakpoint
UPDATE `measurement` SET `seq` = rowid;--> statement-breakpoint
CREATE UNIQUE INDEX `measurement_seq_uq` ON `measurement` (`seq`);--> statement-breakpoint
ALTER TABLE `revision` ADD `row_set` blob;--> statement-breakpoint
-- Rows inserted without a sequence number (anything but an import, which assigns a run itself) get the next one.
CREATE TRIGGER `calculation_seq_fill` AFTER INSERT ON `calculation` WHEN NEW.`seq` IS NULL
BEGIN
  UPDATE `calculation` SET `seq` = (SELECT coalesce(max(`seq`), 0) + 1 FROM `calculation`) WHERE rowid = NEW.rowid;
END;--> statement-breakpoint
CREATE TRIGGER `measurement_seq_fill` AFTER INSERT ON `measurement` WHEN NEW.`seq` IS NULL
BEGIN
  UPDATE `measurement` SET `seq` = (SELECT coalesce(max(`seq`), 0) + 1 FROM `measurement`) WHERE rowid = NEW.rowid;
END;
