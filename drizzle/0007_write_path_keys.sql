DROP INDEX `events_voids_idx` ON `events`;--> statement-breakpoint
ALTER TABLE `unit_stats` ADD `compute_error` varchar(300);--> statement-breakpoint
ALTER TABLE `visits` ADD `content_hash` varchar(64);--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_voids_unique` UNIQUE(`voids_event_id`);