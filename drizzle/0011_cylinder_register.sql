CREATE TABLE `cylinder_moves` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`cylinder_id` int NOT NULL,
	`event_id` bigint unsigned NOT NULL,
	`visit_id` bigint unsigned,
	`unit_id` int NOT NULL,
	`direction` enum('in','out') NOT NULL,
	`kg` double NOT NULL,
	`occurred_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cylinder_moves_id` PRIMARY KEY(`id`),
	CONSTRAINT `cylinder_moves_event_id_unique` UNIQUE(`event_id`)
);
--> statement-breakpoint
CREATE TABLE `cylinder_weighings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`cylinder_id` int NOT NULL,
	`gross_kg` double NOT NULL,
	`weighed_at` datetime(3) NOT NULL,
	`recorded_by` varchar(32) NOT NULL,
	`note` varchar(500),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cylinder_weighings_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `cylinders` (
	`id` int AUTO_INCREMENT NOT NULL,
	`code` varchar(24) NOT NULL,
	`kind` enum('new','recovery') NOT NULL,
	`refrigerant` varchar(16) NOT NULL,
	`tare_kg` double NOT NULL,
	`capacity_kg` double NOT NULL,
	`supplier` varchar(80),
	`lot` varchar(64),
	`gas_origin` enum('virgin','recycled','reclaimed'),
	`site_id` int,
	`status` enum('full','in_use','empty','sent_for_reclaim','quarantined') NOT NULL,
	`notes` varchar(500),
	`quarantined_at` datetime(3),
	`quarantine_reason` varchar(500),
	`quarantined_by` varchar(32),
	`created_by` varchar(32) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cylinders_id` PRIMARY KEY(`id`),
	CONSTRAINT `cylinders_code_unique` UNIQUE(`code`)
);
--> statement-breakpoint
ALTER TABLE `cylinder_moves` ADD CONSTRAINT `cylinder_moves_cylinder_id_cylinders_id_fk` FOREIGN KEY (`cylinder_id`) REFERENCES `cylinders`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinder_moves` ADD CONSTRAINT `cylinder_moves_event_id_events_id_fk` FOREIGN KEY (`event_id`) REFERENCES `events`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinder_moves` ADD CONSTRAINT `cylinder_moves_visit_id_visits_id_fk` FOREIGN KEY (`visit_id`) REFERENCES `visits`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinder_moves` ADD CONSTRAINT `cylinder_moves_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinder_weighings` ADD CONSTRAINT `cylinder_weighings_cylinder_id_cylinders_id_fk` FOREIGN KEY (`cylinder_id`) REFERENCES `cylinders`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinder_weighings` ADD CONSTRAINT `cylinder_weighings_recorded_by_users_id_fk` FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinders` ADD CONSTRAINT `cylinders_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinders` ADD CONSTRAINT `cylinders_quarantined_by_users_id_fk` FOREIGN KEY (`quarantined_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cylinders` ADD CONSTRAINT `cylinders_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `cylinder_moves_cylinder_idx` ON `cylinder_moves` (`cylinder_id`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `cylinder_moves_unit_idx` ON `cylinder_moves` (`unit_id`);--> statement-breakpoint
CREATE INDEX `cylinder_weighings_cylinder_idx` ON `cylinder_weighings` (`cylinder_id`,`weighed_at`);--> statement-breakpoint
CREATE INDEX `cylinders_site_idx` ON `cylinders` (`site_id`,`status`);--> statement-breakpoint
CREATE INDEX `cylinders_lot_idx` ON `cylinders` (`lot`);