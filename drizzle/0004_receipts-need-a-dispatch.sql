CREATE TABLE `receipt_outcomes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`request_id` integer NOT NULL,
	`outcome` text NOT NULL,
	`event_id` integer,
	`reason` text DEFAULT '' NOT NULL,
	`user_id` text NOT NULL,
	`recorded_at` integer NOT NULL,
	FOREIGN KEY (`request_id`) REFERENCES `receipt_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`event_id`) REFERENCES `events`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `receipt_outcomes_request_unique` ON `receipt_outcomes` (`request_id`);--> statement-breakpoint
CREATE TABLE `receipt_requests` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`receiver_party_id` text NOT NULL,
	`code` text NOT NULL,
	`quantity` real NOT NULL,
	`sender_party_id` text,
	`reference_doc` text DEFAULT '' NOT NULL,
	`place` text DEFAULT '' NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`at` integer NOT NULL,
	`user_id` text NOT NULL,
	`recorded_at` integer NOT NULL,
	FOREIGN KEY (`receiver_party_id`) REFERENCES `parties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sender_party_id`) REFERENCES `parties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `receipt_requests_code_idx` ON `receipt_requests` (`code`);--> statement-breakpoint
CREATE INDEX `receipt_requests_receiver_idx` ON `receipt_requests` (`receiver_party_id`);--> statement-breakpoint
ALTER TABLE `lots` ADD `in_transit_to` text REFERENCES parties(id);--> statement-breakpoint
CREATE TRIGGER `receipt_requests_no_update` BEFORE UPDATE ON `receipt_requests`
BEGIN
  SELECT RAISE(ABORT, 'receipt_requests is append-only: record an outcome instead');
END;
--> statement-breakpoint
CREATE TRIGGER `receipt_requests_no_delete` BEFORE DELETE ON `receipt_requests`
BEGIN
  SELECT RAISE(ABORT, 'receipt_requests is append-only: record an outcome instead');
END;
--> statement-breakpoint
CREATE TRIGGER `receipt_outcomes_no_update` BEFORE UPDATE ON `receipt_outcomes`
BEGIN
  SELECT RAISE(ABORT, 'receipt_outcomes is append-only: correct the receipt event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `receipt_outcomes_no_delete` BEFORE DELETE ON `receipt_outcomes`
BEGIN
  SELECT RAISE(ABORT, 'receipt_outcomes is append-only: correct the receipt event instead');
END;
