CREATE TABLE `lot_source_deltas` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`event_id` integer NOT NULL,
	`lot_id` integer NOT NULL,
	`source_lot_id` integer NOT NULL,
	`amount` real NOT NULL,
	FOREIGN KEY (`event_id`) REFERENCES `events`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`source_lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_source_by_lot` ON `lot_source_deltas` (`lot_id`,`source_lot_id`,`amount`);--> statement-breakpoint
CREATE INDEX `lot_source_by_source` ON `lot_source_deltas` (`source_lot_id`,`lot_id`,`amount`);--> statement-breakpoint
CREATE TRIGGER `lot_source_deltas_no_update` BEFORE UPDATE ON `lot_source_deltas`
BEGIN
  SELECT RAISE(ABORT, 'lot_source_deltas is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `lot_source_deltas_no_delete` BEFORE DELETE ON `lot_source_deltas`
BEGIN
  SELECT RAISE(ABORT, 'lot_source_deltas is append-only: record a correcting event instead');
END;
