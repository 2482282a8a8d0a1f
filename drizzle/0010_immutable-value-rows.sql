-- Measurement and calculation rows are never edited once written: a correction is a retraction and a new row.
-- A revision's fingerprint and the recomputation's kept per-material pairings rely on it
-- (lib/benchmark/fingerprint.ts), so the database refuses an edit of what a computation reads,
-- a second sequence number, and bringing a retracted row back. The one edit left is the source: merging two
-- sources of one DOI re-points their rows, and the fingerprint counts the workspace's source merges instead.
CREATE TRIGGER `measurement_rows_immutable` BEFORE UPDATE OF `workspace_id`, `material_id`, `import_id`, `quantity`, `value`, `value_text`, `unit`, `uncertainty`, `temperature_k`, `irrep`, `irrep_normalized`, `branch`, `technique` ON `measurement`
BEGIN
  SELECT RAISE(ABORT, 'measurement rows are never edited: retract the row and add a corrected one');
END;--> statement-breakpoint
CREATE TRIGGER `calculation_rows_immutable` BEFORE UPDATE OF `workspace_id`, `material_id`, `method_id`, `import_id`, `quantity`, `value`, `value_text`, `unit`, `uncertainty`, `temperature_k`, `irrep`, `irrep_normalized`, `branch`, `activity`, `degeneracy`, `mode_index` ON `calculation`
BEGIN
  SELECT RAISE(ABORT, 'calculation rows are never edited: retract the row and add a corrected one');
END;--> statement-breakpoint
CREATE TRIGGER `measurement_seq_fixed` BEFORE UPDATE OF `seq` ON `measurement` WHEN OLD.`seq` IS NOT NULL AND NEW.`seq` IS NOT OLD.`seq`
BEGIN
  SELECT RAISE(ABORT, 'a measurement keeps its sequence number');
END;--> statement-breakpoint
CREATE TRIGGER `calculation_seq_fixed` BEFORE UPDATE OF `seq` ON `calculation` WHEN OLD.`seq` IS NOT NULL AND NEW.`seq` IS NOT OLD.`seq`
BEGIN
  SELECT RAISE(ABORT, 'a calculation keeps its sequence number');
END;--> statement-breakpoint
CREATE TRIGGER `measurement_retraction_final` BEFORE UPDATE OF `retracted_at` ON `measurement` WHEN OLD.`retracted_at` IS NOT NULL AND NEW.`retracted_at` IS NULL
BEGIN
  SELECT RAISE(ABORT, 'a retracted measurement stays retracted: add it again instead');
END;--> statement-breakpoint
CREATE TRIGGER `calculation_retraction_final` BEFORE UPDATE OF `retracted_at` ON `calculation` WHEN OLD.`retracted_at` IS NOT NULL AND NEW.`retracted_at` IS NULL
BEGIN
  SELECT RAISE(ABORT, 'a retracted calculation stays retracted: add it again instead');
END;
