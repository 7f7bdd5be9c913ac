-- Session ids become the SHA-256 of the cookie's token. Rows written before hold raw tokens as ids and
-- could match no cookie; they are ended here, and everyone signs in once more.
DELETE FROM `sessions`;--> statement-breakpoint
-- SQLite adds a NOT NULL column only with a default; the table is empty by now, so 0 is never read.
ALTER TABLE `sessions` ADD `signed_in_at` integer NOT NULL DEFAULT 0;--> statement-breakpoint
ALTER TABLE `sign_in_throttle` ADD `blocked_until` integer;
