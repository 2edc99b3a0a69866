CREATE TABLE `unit_changes` (
	`id` int AUTO_INCREMENT NOT NULL,
	`unit_id` int NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`at` datetime(3) NOT NULL,
	`field` varchar(40) NOT NULL,
	`before` text,
	`after` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `unit_changes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `unit_imports` (
	`id` int AUTO_INCREMENT NOT NULL,
	`import_key` varchar(43) NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`status` enum('running','committed','failed') NOT NULL DEFAULT 'running',
	`total_rows` int NOT NULL DEFAULT 0,
	`processed_rows` int NOT NULL DEFAULT 0,
	`inserted_rows` int NOT NULL DEFAULT 0,
	`message` varchar(500),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`finished_at` datetime(3),
	CONSTRAINT `unit_imports_id` PRIMARY KEY(`id`),
	CONSTRAINT `unit_imports_import_key_unique` UNIQUE(`import_key`)
);
--> statement-breakpoint
ALTER TABLE `units` ADD `machinery_serial` varchar(40);--> statement-breakpoint
ALTER TABLE `units` ADD `model` varchar(60);--> statement-breakpoint
ALTER TABLE `units` ADD `manufacture_year` smallint;--> statement-breakpoint
ALTER TABLE `units` ADD `purchase_cost` decimal(12,2);--> statement-breakpoint
ALTER TABLE `units` ADD `residual_value` decimal(12,2);--> statement-breakpoint
ALTER TABLE `units` ADD `notes` text;--> statement-breakpoint
ALTER TABLE `units` ADD `qr_issued_at` datetime(3) DEFAULT CURRENT_TIMESTAMP(3) NOT NULL;--> statement-breakpoint
ALTER TABLE `units` ADD `updated_at` datetime(3) DEFAULT CURRENT_TIMESTAMP(3) NOT NULL;--> statement-breakpoint
ALTER TABLE `unit_changes` ADD CONSTRAINT `unit_changes_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `unit_changes` ADD CONSTRAINT `unit_changes_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `unit_imports` ADD CONSTRAINT `unit_imports_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `unit_changes_unit_at_idx` ON `unit_changes` (`unit_id`,`at`);--> statement-breakpoint
CREATE INDEX `unit_imports_user_idx` ON `unit_imports` (`user_id`);--> statement-breakpoint
CREATE INDEX `units_refrigerant_idx` ON `units` (`refrigerant`);--> statement-breakpoint
CREATE INDEX `units_updated_at_idx` ON `units` (`updated_at`);