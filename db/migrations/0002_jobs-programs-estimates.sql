CREATE TABLE `estimates` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`program_id` int NOT NULL,
	`program_version_id` int NOT NULL,
	`program_version` int NOT NULL,
	`machine_id` int NOT NULL,
	`machine_version` int NOT NULL,
	`engine_version` varchar(20) NOT NULL,
	`input_key` char(64) NOT NULL,
	`settings` json NOT NULL,
	`status` enum('pending','running','done','failed') NOT NULL DEFAULT 'pending',
	`progress` double NOT NULL DEFAULT 0,
	`error` text,
	`compute_ms` int,
	`total_seconds` double,
	`calibrated_seconds` double,
	`error_count` int,
	`warning_count` int,
	`info_count` int,
	`part_count` int,
	`report_key` varchar(255),
	`attempts` int NOT NULL DEFAULT 0,
	`lease_owner` varchar(80),
	`lease_until` timestamp(3),
	`requested_by` int,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	`finished_at` timestamp,
	CONSTRAINT `estimates_id` PRIMARY KEY(`id`),
	CONSTRAINT `estimates_input_unique` UNIQUE(`shop_id`,`input_key`)
);
--> statement-breakpoint
CREATE TABLE `job_events` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`job_id` int NOT NULL,
	`user_id` int,
	`kind` varchar(40) NOT NULL,
	`detail` varchar(500) NOT NULL DEFAULT '',
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `job_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `program_versions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`program_id` int NOT NULL,
	`version` int NOT NULL,
	`object_key` varchar(255) NOT NULL,
	`sha256` char(64) NOT NULL,
	`bytes` bigint NOT NULL,
	`lines` int NOT NULL,
	`uploaded_by` int,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `program_versions_id` PRIMARY KEY(`id`),
	CONSTRAINT `program_versions_unique` UNIQUE(`program_id`,`version`)
);
--> statement-breakpoint
CREATE TABLE `programs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`job_id` int NOT NULL,
	`name` varchar(200) NOT NULL,
	`latest_version` int NOT NULL DEFAULT 1,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `programs_id` PRIMARY KEY(`id`),
	CONSTRAINT `programs_job_name_unique` UNIQUE(`job_id`,`name`)
);
--> statement-breakpoint
ALTER TABLE `jobs` MODIFY COLUMN `status` enum('draft','programmed','quoted','accepted','scheduled','running','done','cancelled') NOT NULL DEFAULT 'draft';--> statement-breakpoint
ALTER TABLE `jobs` ADD `machine_id` int;--> statement-breakpoint
ALTER TABLE `jobs` ADD `due_date` date;--> statement-breakpoint
ALTER TABLE `jobs` ADD `notes` text;--> statement-breakpoint
ALTER TABLE `machines` ADD `archived_at` timestamp;--> statement-breakpoint
ALTER TABLE `shops` ADD `length_unit` enum('mm','inch') DEFAULT 'mm' NOT NULL;--> statement-breakpoint
ALTER TABLE `estimates` ADD CONSTRAINT `estimates_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `estimates` ADD CONSTRAINT `estimates_program_id_programs_id_fk` FOREIGN KEY (`program_id`) REFERENCES `programs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `estimates` ADD CONSTRAINT `estimates_program_version_id_program_versions_id_fk` FOREIGN KEY (`program_version_id`) REFERENCES `program_versions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `estimates` ADD CONSTRAINT `estimates_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `estimates` ADD CONSTRAINT `estimates_requested_by_users_id_fk` FOREIGN KEY (`requested_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_events` ADD CONSTRAINT `job_events_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_events` ADD CONSTRAINT `job_events_job_id_jobs_id_fk` FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_events` ADD CONSTRAINT `job_events_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `program_versions` ADD CONSTRAINT `program_versions_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `program_versions` ADD CONSTRAINT `program_versions_program_id_programs_id_fk` FOREIGN KEY (`program_id`) REFERENCES `programs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `program_versions` ADD CONSTRAINT `program_versions_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `programs` ADD CONSTRAINT `programs_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `programs` ADD CONSTRAINT `programs_job_id_jobs_id_fk` FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `estimates_queue_idx` ON `estimates` (`status`,`id`);--> statement-breakpoint
CREATE INDEX `estimates_program_idx` ON `estimates` (`program_id`,`program_version`);--> statement-breakpoint
CREATE INDEX `job_events_job_idx` ON `job_events` (`job_id`,`id`);--> statement-breakpoint
CREATE INDEX `program_versions_sha_idx` ON `program_versions` (`shop_id`,`sha256`);--> statement-breakpoint
CREATE INDEX `programs_shop_idx` ON `programs` (`shop_id`);--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `jobs_shop_updated_idx` ON `jobs` (`shop_id`,`updated_at`);