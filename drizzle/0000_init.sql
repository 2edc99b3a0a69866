CREATE TABLE `sessions` (
	`id` varchar(255) NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`expires_at` datetime NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sessions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` varchar(32) NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`role` enum('technician','engineer','owner','admin') NOT NULL,
	`password_hash` varchar(255),
	`certificate_number` varchar(64),
	`active` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `sites` (
	`id` int AUTO_INCREMENT NOT NULL,
	`code` varchar(16) NOT NULL,
	`name` varchar(120) NOT NULL,
	`kind` enum('depot','terminal','vessel','workshop') NOT NULL,
	`country` varchar(2),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sites_id` PRIMARY KEY(`id`),
	CONSTRAINT `sites_code_unique` UNIQUE(`code`)
);
--> statement-breakpoint
CREATE TABLE `units` (
	`id` int AUTO_INCREMENT NOT NULL,
	`container_number` char(11) NOT NULL,
	`refrigerant` varchar(16) NOT NULL,
	`nominal_charge_kg` double NOT NULL,
	`commissioned_on` date,
	`site_id` int,
	`status` enum('in_service','out_of_service','retired') NOT NULL DEFAULT 'in_service',
	`qr_token` varchar(43) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `units_id` PRIMARY KEY(`id`),
	CONSTRAINT `units_container_number_unique` UNIQUE(`container_number`),
	CONSTRAINT `units_qr_token_unique` UNIQUE(`qr_token`)
);
--> statement-breakpoint
ALTER TABLE `sessions` ADD CONSTRAINT `sessions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `units` ADD CONSTRAINT `units_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE INDEX `units_site_idx` ON `units` (`site_id`);--> statement-breakpoint
CREATE INDEX `units_status_idx` ON `units` (`status`);