ALTER TABLE `users` ADD `certificate_expires_on` date;--> statement-breakpoint
ALTER TABLE `sites` ADD `jurisdiction` enum('EU','US','custom');--> statement-breakpoint
ALTER TABLE `sites` ADD `time_zone` varchar(64);--> statement-breakpoint
ALTER TABLE `visits` ADD `certificate_number` varchar(64);--> statement-breakpoint
ALTER TABLE `visits` ADD `certificate_expires_on` date;