CREATE TABLE `known_devices` (
	`id` varchar(64) NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`last_used_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`expires_at` datetime NOT NULL,
	CONSTRAINT `known_devices_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `rate_limits` (
	`key` varchar(255) NOT NULL,
	`points` int NOT NULL DEFAULT 0,
	`expire` bigint unsigned,
	CONSTRAINT `rate_limits_key` PRIMARY KEY(`key`)
);
--> statement-breakpoint
ALTER TABLE `sessions` ADD `last_seen_at` datetime(3) DEFAULT CURRENT_TIMESTAMP(3) NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `user_agent` varchar(255);--> statement-breakpoint
ALTER TABLE `sessions` ADD `ip_address` varchar(45);--> statement-breakpoint
ALTER TABLE `known_devices` ADD CONSTRAINT `known_devices_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `known_devices_user_idx` ON `known_devices` (`user_id`);