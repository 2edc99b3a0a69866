CREATE TABLE `cache_versions` (
	`name` varchar(40) NOT NULL,
	`shard` tinyint unsigned NOT NULL,
	`version` bigint unsigned NOT NULL DEFAULT 0,
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cache_versions_name_shard_pk` PRIMARY KEY(`name`,`shard`)
);
--> statement-breakpoint
CREATE TABLE `leases` (
	`name` varchar(64) NOT NULL,
	`holder` varchar(100) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`acquired_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `leases_name` PRIMARY KEY(`name`)
);
