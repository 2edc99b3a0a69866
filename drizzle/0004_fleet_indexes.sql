CREATE TABLE `background_jobs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`kind` enum('stats_recompute','repair_effectiveness') NOT NULL,
	`status` enum('running','done','failed','superseded') NOT NULL DEFAULT 'running',
	`settings_id` int,
	`total` int NOT NULL DEFAULT 0,
	`processed` int NOT NULL DEFAULT 0,
	`cursor_unit_id` int NOT NULL DEFAULT 0,
	`message` varchar(500),
	`created_by` varchar(32),
	`started_at` datetime(3) NOT NULL,
	`heartbeat_at` datetime(3) NOT NULL,
	`finished_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `background_jobs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `fleet_monthly` (
	`month` char(7) NOT NULL,
	`site_id` int NOT NULL,
	`refrigerant` varchar(16) NOT NULL,
	`made_up_kg` double NOT NULL DEFAULT 0,
	`visits` int NOT NULL DEFAULT 0,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `fleet_monthly_month_site_id_refrigerant_pk` PRIMARY KEY(`month`,`site_id`,`refrigerant`)
);
--> statement-breakpoint
CREATE TABLE `repair_effectiveness` (
	`location` varchar(32) NOT NULL,
	`action` varchar(32) NOT NULL,
	`repairs` int NOT NULL,
	`held` int NOT NULL,
	`recurred` int NOT NULL,
	`pending` int NOT NULL,
	`hold_rate_pct` double,
	`computed_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `repair_effectiveness_location_action_pk` PRIMARY KEY(`location`,`action`)
);
--> statement-breakpoint
CREATE TABLE `settings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`data` json NOT NULL,
	`changed_sections` json NOT NULL,
	`updated_by` varchar(32) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `settings_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `visit_made_up` (
	`visit_id` bigint unsigned NOT NULL,
	`unit_id` int NOT NULL,
	`month` char(7) NOT NULL,
	`site_id` int NOT NULL,
	`refrigerant` varchar(16) NOT NULL,
	`made_up_kg` double NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `visit_made_up_visit_id` PRIMARY KEY(`visit_id`)
);
--> statement-breakpoint
ALTER TABLE `background_jobs` ADD CONSTRAINT `background_jobs_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `settings` ADD CONSTRAINT `settings_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `background_jobs_kind_idx` ON `background_jobs` (`kind`,`id`);--> statement-breakpoint
CREATE INDEX `visit_made_up_unit_idx` ON `visit_made_up` (`unit_id`);--> statement-breakpoint
CREATE INDEX `units_site_number_idx` ON `units` (`site_id`,`container_number`);--> statement-breakpoint
CREATE INDEX `unit_stats_band_score_idx` ON `unit_stats` (`score_band`,`score`);--> statement-breakpoint
CREATE INDEX `unit_stats_co2e_idx` ON `unit_stats` (`co2e_tonnes`);