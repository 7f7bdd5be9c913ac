-- The ledger is append-only: events and everything hanging on them can be added, never
-- changed or removed. A mistake is put right by a new `correcting` event.
CREATE TRIGGER `events_no_update` BEFORE UPDATE ON `events`
BEGIN
  SELECT RAISE(ABORT, 'events is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `events_no_delete` BEFORE DELETE ON `events`
BEGIN
  SELECT RAISE(ABORT, 'events is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `event_inputs_no_update` BEFORE UPDATE ON `event_inputs`
BEGIN
  SELECT RAISE(ABORT, 'event_inputs is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `event_inputs_no_delete` BEFORE DELETE ON `event_inputs`
BEGIN
  SELECT RAISE(ABORT, 'event_inputs is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `event_outputs_no_update` BEFORE UPDATE ON `event_outputs`
BEGIN
  SELECT RAISE(ABORT, 'event_outputs is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `event_outputs_no_delete` BEFORE DELETE ON `event_outputs`
BEGIN
  SELECT RAISE(ABORT, 'event_outputs is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `lineage_edges_no_update` BEFORE UPDATE ON `lineage_edges`
BEGIN
  SELECT RAISE(ABORT, 'lineage_edges is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `lineage_edges_no_delete` BEFORE DELETE ON `lineage_edges`
BEGIN
  SELECT RAISE(ABORT, 'lineage_edges is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_no_update` BEFORE UPDATE ON `measurements`
BEGIN
  SELECT RAISE(ABORT, 'measurements is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_no_delete` BEFORE DELETE ON `measurements`
BEGIN
  SELECT RAISE(ABORT, 'measurements is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `attachments_no_update` BEFORE UPDATE ON `attachments`
BEGIN
  SELECT RAISE(ABORT, 'attachments is append-only: record a correcting event instead');
END;
--> statement-breakpoint
CREATE TRIGGER `attachments_no_delete` BEFORE DELETE ON `attachments`
BEGIN
  SELECT RAISE(ABORT, 'attachments is append-only: record a correcting event instead');
END;
