CREATE TABLE `unit_depot_state` (
	`unit_id` int NOT NULL,
	`computed_at` datetime(3) NOT NULL,
	`recheck_due` date,
	`recheck_reason` enum('top_up','repair'),
	`recheck_source_event_id` bigint unsigned,
	`missed_rechecks_365` int NOT NULL DEFAULT 0,
	`quarantined_since` datetime(3),
	`quarantine_reason` varchar(300),
	`quarantine_event_id` bigint unsigned,
	CONSTRAINT `unit_depot_state_unit_id` PRIMARY KEY(`unit_id`)
);
--> statement-breakpoint
ALTER TABLE `unit_depot_state` ADD CONSTRAINT `unit_depot_state_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `unit_depot_state_recheck_idx` ON `unit_depot_state` (`recheck_due`);--> statement-breakpoint
CREATE INDEX `unit_depot_state_quarantine_idx` ON `unit_depot_state` (`quarantined_since`);