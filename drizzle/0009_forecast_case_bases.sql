CREATE TABLE `forecast_case_bases` (
	`id` int AUTO_INCREMENT NOT NULL,
	`built_at` datetime(3) NOT NULL,
	`cases` int NOT NULL,
	`units` int NOT NULL,
	`build_ms` int NOT NULL,
	`accuracy` json,
	`data` longblob NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `forecast_case_bases_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `background_jobs` MODIFY COLUMN `kind` enum('stats_recompute','repair_effectiveness','forecast_cases') NOT NULL;