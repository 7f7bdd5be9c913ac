CREATE TABLE `lot_holds` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lot_id` integer NOT NULL,
	`action` text NOT NULL,
	`reason` text NOT NULL,
	`recall_code` text DEFAULT '' NOT NULL,
	`user_id` text NOT NULL,
	`at` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_holds_lot_idx` ON `lot_holds` (`lot_id`,`id`);--> statement-breakpoint
CREATE TRIGGER `lot_holds_no_update` BEFORE UPDATE ON `lot_holds`
BEGIN
  SELECT RAISE(ABORT, 'lot_holds is append-only: record a release (or a new hold) instead');
END;
--> statement-breakpoint
CREATE TRIGGER `lot_holds_no_delete` BEFORE DELETE ON `lot_holds`
BEGIN
  SELECT RAISE(ABORT, 'lot_holds is append-only: record a release (or a new hold) instead');
END;
