CREATE TABLE `alert_kind_choices` (
	`user_id` varchar(32) NOT NULL,
	`kind` varchar(32) NOT NULL,
	`all_sites` boolean NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `alert_kind_choices_user_id_kind_pk` PRIMARY KEY(`user_id`,`kind`)
);
--> statement-breakpoint
ALTER TABLE `alert_kind_choices` ADD CONSTRAINT `alert_kind_choices_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;