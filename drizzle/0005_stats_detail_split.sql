CREATE TABLE `unit_stats_detail` (
	`unit_id` int NOT NULL,
	`score_factors` json,
	`detail` json,
	CONSTRAINT `unit_stats_detail_unit_id` PRIMARY KEY(`unit_id`)
);
--> statement-breakpoint
ALTER TABLE `unit_stats_detail` ADD CONSTRAINT `unit_stats_detail_unit_id_units_id_fk` FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
INSERT INTO `unit_stats_detail` (`unit_id`, `score_factors`, `detail`) SELECT `unit_id`, `score_factors`, `detail` FROM `unit_stats`;--> statement-breakpoint
ALTER TABLE `unit_stats` DROP COLUMN `score_factors`, DROP COLUMN `detail`;--> statement-breakpoint
-- MariaDB drops columns instantly, leaving their bytes in every row: the rebuild makes the rows really shrink.
ALTER TABLE `unit_stats` FORCE;