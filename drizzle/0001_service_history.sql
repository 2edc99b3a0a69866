CREATE TABLE `attachments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`event_id` bigint unsigned NOT NULL,
	`unit_id` int NOT NULL,
	`storage_key` varchar(80) NOT NULL,
	`thumbnail_key` varchar(80),
	`mime_type` varchar(64) NOT NULL,
	`size_bytes` int NOT NULL,
	`original_name` varchar(255) NOT NULL,
	`uploaded_by` varchar(32) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `attachments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`unit_id` int NOT NULL,
	`visit_id` bigint unsigned,
	`site_id` int,
	`recorded_by` varchar(32) NOT NULL,
	`kind` enum('pti','leak_check','repair','component_replacement','status_change','note','decision','top_up','recovery','recharge','pressure','void') NOT NULL,
	`occurred_at` datetime(3) NOT NULL,
	`entered_at` datetime(3) NOT NULL,
	`kg` double,
	`cylinder` varchar(64),
	`reused_recovered` boolean,
	`excluded_from_leak_rate` boolean,
	`method` varchar(32),
	`leak_found` boolean,
	`location` varchar(32),
	`action` varchar(32),
	`verified` boolean,
	`passed` boolean,
	`suction_kpag` double,
	`discharge_kpag` double,
	`ambient_c` double,
	`set_point_c` double,
	`supply_air_c` double,
	`return_air_c` double,
	`sight_glass` varchar(16),
	`details` json,
	`note` varchar(2000),
	`voids_event_id` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `unit_stats` (
	`unit_id` int NOT NULL,
	`computed_at` datetime(3) NOT NULL,
	`rolling_leak_rate_pct` double NOT NULL DEFAULT 0,
	`calendar_year_share_pct` double NOT NULL DEFAULT 0,
	`score` int NOT NULL DEFAULT 0,
	`score_band` enum('tight','watch','chronic') NOT NULL DEFAULT 'tight',
	`score_factors` json,
	`forecast_date` date,
	`forecast_earliest` date,
	`forecast_latest` date,
	`forecast_overdue` boolean NOT NULL DEFAULT false,
	`co2e_tonnes` double NOT NULL DEFAULT 0,
	`leak_check_interval_months` int,
	`last_leak_check_at` datetime(3),
	`next_leak_check_due` date,
	`pti_valid_until` date,
	`pti_passed` boolean,
	`pressure_flag` enum('ok','possible_low_charge','unknown') NOT NULL DEFAULT 'unknown',
	`open_leak_found_at` datetime(3),
	`made_up_kg_365` double NOT NULL DEFAULT 0,
	`event_count` int NOT NULL DEFAULT 0,
	`visit_count` int NOT NULL DEFAULT 0,
	`top_up_count` int NOT NULL DEFAULT 0,
	`last_event_at` datetime(3),
	`detail` json,
	CONSTRAINT `unit_stats_unit_id` PRIMARY KEY(`unit_id`)
);
--> statement-breakpoint
CREATE TABLE `visits` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`unit_id` int NOT NULL,
	`site_id` int,
	`recorded_by` varchar(32) NOT NULL,
	`occurred_at` datetime(3) NOT NULL,
	`entered_at` datetime(3) NOT NULL,
	`idempotency_key` varchar(64) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `visits_id` PRIMARY KEY(`id`),
	CONSTRAINT `visits_idempotency_key_unique` UNIQUE(`idempotency_key`)
);
--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_event_id_events_id_fk` FOREIGN KEY (`event_id`) REFERENCES `events`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_visit_id_visits_id_fk` FOREIGN KEY (`visit_id`) REFERENCES `visits`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_recorded_by_users_id_fk` FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `unit_stats` ADD CONSTRAINT `unit_stats_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `visits` ADD CONSTRAINT `visits_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `visits` ADD CONSTRAINT `visits_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `visits` ADD CONSTRAINT `visits_recorded_by_users_id_fk` FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `attachments_event_idx` ON `attachments` (`event_id`);--> statement-breakpoint
CREATE INDEX `events_unit_time_idx` ON `events` (`unit_id`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `events_visit_idx` ON `events` (`visit_id`);--> statement-breakpoint
CREATE INDEX `events_voids_idx` ON `events` (`voids_event_id`);--> statement-breakpoint
CREATE INDEX `events_cylinder_idx` ON `events` (`cylinder`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `events_site_time_idx` ON `events` (`site_id`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `events_kind_time_idx` ON `events` (`kind`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `unit_stats_score_idx` ON `unit_stats` (`score`);--> statement-breakpoint
CREATE INDEX `unit_stats_rate_idx` ON `unit_stats` (`rolling_leak_rate_pct`);--> statement-breakpoint
CREATE INDEX `unit_stats_forecast_idx` ON `unit_stats` (`forecast_date`);--> statement-breakpoint
CREATE INDEX `unit_stats_leak_check_idx` ON `unit_stats` (`next_leak_check_due`);--> statement-breakpoint
CREATE INDEX `unit_stats_pti_idx` ON `unit_stats` (`pti_valid_until`);--> statement-breakpoint
CREATE INDEX `visits_unit_idx` ON `visits` (`unit_id`,`occurred_at`);