CREATE TABLE `supplier_contracts` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`party_id` text NOT NULL,
	`kind` text NOT NULL,
	`scope` text NOT NULL,
	`variety` text,
	`crop_year` integer,
	`version` integer NOT NULL,
	`terms` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`user_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`party_id`) REFERENCES `parties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `supplier_contracts_version_unique` ON `supplier_contracts` (`party_id`,`scope`,`version`);--> statement-breakpoint
CREATE TABLE `supplier_entries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`party_id` text NOT NULL,
	`kind` text NOT NULL,
	`at` integer NOT NULL,
	`amount_yen` integer NOT NULL,
	`tax_rate_pct` integer NOT NULL,
	`event_id` integer,
	`reverses_entry_id` integer,
	`contract_id` integer,
	`lot_id` integer,
	`detail` text DEFAULT '{}' NOT NULL,
	`method` text DEFAULT '' NOT NULL,
	`reference` text DEFAULT '' NOT NULL,
	`reason` text DEFAULT '' NOT NULL,
	`user_id` text NOT NULL,
	`recorded_at` integer NOT NULL,
	FOREIGN KEY (`party_id`) REFERENCES `parties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`event_id`) REFERENCES `events`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`contract_id`) REFERENCES `supplier_contracts`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`lot_id`) REFERENCES `lots`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `supplier_entries_party_idx` ON `supplier_entries` (`party_id`,`at`);--> statement-breakpoint
CREATE INDEX `supplier_entries_event_idx` ON `supplier_entries` (`event_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `supplier_entries_reverses_unique` ON `supplier_entries` (`reverses_entry_id`);--> statement-breakpoint
CREATE TABLE `supplier_statement_entries` (
	`statement_id` integer NOT NULL,
	`entry_id` integer NOT NULL,
	FOREIGN KEY (`statement_id`) REFERENCES `supplier_statements`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`entry_id`) REFERENCES `supplier_entries`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `supplier_statement_entries_entry_unique` ON `supplier_statement_entries` (`entry_id`);--> statement-breakpoint
CREATE INDEX `supplier_statement_entries_statement_idx` ON `supplier_statement_entries` (`statement_id`);--> statement-breakpoint
CREATE TABLE `supplier_statements` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`number` text NOT NULL,
	`party_id` text NOT NULL,
	`from_day` text NOT NULL,
	`to_day` text NOT NULL,
	`rounding` text NOT NULL,
	`totals` text NOT NULL,
	`balance_yen` integer NOT NULL,
	`user_id` text NOT NULL,
	`issued_at` integer NOT NULL,
	FOREIGN KEY (`party_id`) REFERENCES `parties`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `supplier_statements_number_unique` ON `supplier_statements` (`number`);--> statement-breakpoint
CREATE INDEX `supplier_statements_party_idx` ON `supplier_statements` (`party_id`);--> statement-breakpoint
ALTER TABLE `parties` ADD `invoice_number` text;--> statement-breakpoint
-- The supplier ledger is append-only like the lot ledger: a wrong entry is reversed by a new one,
-- a contract is superseded by a new version, a statement is never re-issued in place.
CREATE TRIGGER `supplier_contracts_no_update` BEFORE UPDATE ON `supplier_contracts`
BEGIN
  SELECT RAISE(ABORT, 'supplier_contracts is append-only: add a new contract version instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_contracts_no_delete` BEFORE DELETE ON `supplier_contracts`
BEGIN
  SELECT RAISE(ABORT, 'supplier_contracts is append-only: add a new contract version instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_entries_no_update` BEFORE UPDATE ON `supplier_entries`
BEGIN
  SELECT RAISE(ABORT, 'supplier_entries is append-only: record a reversing entry or an adjustment instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_entries_no_delete` BEFORE DELETE ON `supplier_entries`
BEGIN
  SELECT RAISE(ABORT, 'supplier_entries is append-only: record a reversing entry or an adjustment instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_statements_no_update` BEFORE UPDATE ON `supplier_statements`
BEGIN
  SELECT RAISE(ABORT, 'supplier_statements is append-only: issue a new statement instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_statements_no_delete` BEFORE DELETE ON `supplier_statements`
BEGIN
  SELECT RAISE(ABORT, 'supplier_statements is append-only: issue a new statement instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_statement_entries_no_update` BEFORE UPDATE ON `supplier_statement_entries`
BEGIN
  SELECT RAISE(ABORT, 'supplier_statement_entries is append-only: issue a new statement instead');
END;
--> statement-breakpoint
CREATE TRIGGER `supplier_statement_entries_no_delete` BEFORE DELETE ON `supplier_statement_entries`
BEGIN
  SELECT RAISE(ABORT, 'supplier_statement_entries is append-only: issue a new statement instead');
END;
