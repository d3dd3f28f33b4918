ALTER TABLE `machines` RENAME COLUMN `junction_deviation_mm` TO `corner_tolerance_mm`;--> statement-breakpoint
ALTER TABLE `machines` RENAME COLUMN `max_block_rate_per_s` TO `max_blocks_per_s`;--> statement-breakpoint
ALTER TABLE `machines` RENAME COLUMN `arc_tolerance_mm` TO `chord_tolerance_mm`;--> statement-breakpoint
-- Stored profile snapshots take the new key names too; a key is a quoted name followed by a colon
-- (a quote inside a string value is escaped, so values are left as they are).
UPDATE `machine_versions` SET `profile` = REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(REGEXP_REPLACE(`profile`, '"travel"[[:space:]]*:', '"travelMm":'), '"home"[[:space:]]*:', '"homeMm":'), '"maxFeed"[[:space:]]*:', '"maxFeedMmPerMin":'), '"rapid"[[:space:]]*:', '"rapidMmPerMin":'), '"accel"[[:space:]]*:', '"accelMmPerS2":'), '"junctionDeviation"[[:space:]]*:', '"cornerToleranceMm":'), '"lookahead"[[:space:]]*:', '"lookaheadBlocks":'), '"maxBlockRate"[[:space:]]*:', '"maxBlocksPerS":'), '"arcTolerance"[[:space:]]*:', '"chordToleranceMm":'), '"diameter"[[:space:]]*:', '"diameterMm":');
