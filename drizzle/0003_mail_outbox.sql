CREATE TABLE `account_links` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`purpose` enum('invitation','password_reset') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `account_links_id` PRIMARY KEY(`id`),
	CONSTRAINT `account_links_token_hash_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `alert_subscriptions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` varchar(32) NOT NULL,
	`site_id` int NOT NULL,
	`kind` enum('chronic','leak_rate','open_leak','digest') NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `alert_subscriptions_id` PRIMARY KEY(`id`),
	CONSTRAINT `alert_subscriptions_user_site_kind_uq` UNIQUE(`user_id`,`site_id`,`kind`)
);
--> statement-breakpoint
CREATE TABLE `dev_mailbox` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`received_at` datetime(3) NOT NULL,
	`from_header` varchar(400) NOT NULL,
	`to_header` varchar(1000) NOT NULL,
	`subject` varchar(400) NOT NULL,
	`text_body` mediumtext NOT NULL,
	`html_body` mediumtext,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `dev_mailbox_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mail_keys` (
	`id` varchar(32) NOT NULL,
	`secret` char(64) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `mail_keys_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`dedupe_key` varchar(191) NOT NULL,
	`kind` enum('invitation','password_reset','alert','digest') NOT NULL,
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(300) NOT NULL,
	`text_body` mediumtext NOT NULL,
	`html_body` mediumtext NOT NULL,
	`headers` json,
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL,
	`locked_until` datetime(3),
	`sent_at` datetime(3),
	`last_error` varchar(1000),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `mail_outbox_id` PRIMARY KEY(`id`),
	CONSTRAINT `mail_outbox_dedupe_key_unique` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
ALTER TABLE `account_links` ADD CONSTRAINT `account_links_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alert_subscriptions` ADD CONSTRAINT `alert_subscriptions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alert_subscriptions` ADD CONSTRAINT `alert_subscriptions_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `account_links_user_idx` ON `account_links` (`user_id`,`purpose`);--> statement-breakpoint
CREATE INDEX `alert_subscriptions_site_kind_idx` ON `alert_subscriptions` (`site_id`,`kind`);--> statement-breakpoint
CREATE INDEX `dev_mailbox_received_idx` ON `dev_mailbox` (`received_at`);--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`sent_at`,`next_attempt_at`);