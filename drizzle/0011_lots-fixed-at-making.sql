-- What a lot is, and what it was made from, is fixed when its event makes it: the kept
-- lineages, the edge index and the kept tank facts (src/server/trace/) rest on it. Only the
-- running totals, the holder and the moisture reading of its own making change after.
CREATE TRIGGER `lots_fixed_at_making` BEFORE UPDATE OF `id`, `code`, `kind`, `unit`, `origin_party_id`, `field_id`, `variety`, `crop_year`, `grade`, `polishing_ratio_pct`, `attributes`, `created_at` ON `lots`
BEGIN
  SELECT RAISE(ABORT, 'a lot is fixed when it is made: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `lots_no_delete` BEFORE DELETE ON `lots`
BEGIN
  SELECT RAISE(ABORT, 'lots are never deleted: record a correcting event instead');
END;
