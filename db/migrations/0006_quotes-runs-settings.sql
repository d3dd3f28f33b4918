CREATE TABLE `mail_log` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`quote_id` int,
	`to_address` varchar(190) NOT NULL,
	`subject` varchar(300) NOT NULL,
	`status` enum('sending','sent','failed') NOT NULL DEFAULT 'sending',
	`message_id` varchar(255),
	`error` varchar(1000),
	`sent_by` int,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `mail_log_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `quote_counters` (
	`shop_id` int NOT NULL,
	`year` int NOT NULL,
	`next` int NOT NULL DEFAULT 1,
	CONSTRAINT `quote_counters_shop_id_year_pk` PRIMARY KEY(`shop_id`,`year`)
);
--> statement-breakpoint
CREATE TABLE `quotes` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`job_id` int NOT NULL,
	`estimate_id` int NOT NULL,
	`number` varchar(20) NOT NULL,
	`revision_of` int,
	`status` enum('draft','sent','accepted','declined','expired') NOT NULL DEFAULT 'draft',
	`currency` char(3) NOT NULL,
	`total_minor` bigint NOT NULL,
	`inputs` json NOT NULL,
	`figures` json NOT NULL,
	`lines` json NOT NULL,
	`validity_days` int NOT NULL,
	`valid_until` date,
	`token_hash` char(64),
	`token_used_at` timestamp,
	`token_revoked_at` timestamp,
	`sent_at` timestamp,
	`answered_at` timestamp,
	`answer_name` varchar(160),
	`answer_po` varchar(80),
	`decline_reason` varchar(1000),
	`created_by` int,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `quotes_id` PRIMARY KEY(`id`),
	CONSTRAINT `quotes_shop_number_unique` UNIQUE(`shop_id`,`number`),
	CONSTRAINT `quotes_token_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `run_changes` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`run_id` int NOT NULL,
	`user_id` int NOT NULL,
	`field` varchar(40) NOT NULL,
	`before` varchar(2000),
	`after` varchar(2000),
	`reason` varchar(500) NOT NULL DEFAULT '',
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `run_changes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `run_events` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`run_id` int NOT NULL,
	`kind` enum('start','pause','resume','finish') NOT NULL,
	`at` timestamp(3) NOT NULL,
	`user_id` int,
	CONSTRAINT `run_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `runs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`job_id` int NOT NULL,
	`program_id` int NOT NULL,
	`program_version` int NOT NULL,
	`machine_id` int NOT NULL,
	`machine_version` int NOT NULL,
	`estimate_id` int,
	`operator_id` int NOT NULL,
	`status` enum('running','paused','finished','voided') NOT NULL DEFAULT 'running',
	`active_machine_id` int GENERATED ALWAYS AS ((case when `status` in ('running','paused') then `machine_id` end)) STORED,
	`started_at` timestamp(3) NOT NULL,
	`finished_at` timestamp(3),
	`actual_seconds` double,
	`sheets_cut` int,
	`interrupted` boolean NOT NULL DEFAULT false,
	`notes` varchar(2000),
	`manual` boolean NOT NULL DEFAULT false,
	`voided_at` timestamp,
	`voided_by` int,
	`void_reason` varchar(500),
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `runs_id` PRIMARY KEY(`id`),
	CONSTRAINT `runs_active_machine_unique` UNIQUE(`active_machine_id`)
);
--> statement-breakpoint
CREATE TABLE `shop_settings` (
	`shop_id` int NOT NULL,
	`address` varchar(500) NOT NULL DEFAULT '',
	`quote_terms` varchar(2000) NOT NULL DEFAULT '',
	`quote_validity_days` int NOT NULL DEFAULT 30,
	`setup_s` double NOT NULL DEFAULT 900,
	`load_unload_s_per_sheet` double NOT NULL DEFAULT 240,
	`waste_allowance_bp` int NOT NULL DEFAULT 1000,
	`margin_bp` int NOT NULL DEFAULT 2500,
	`tax_bp` int NOT NULL DEFAULT 0,
	`round_to_minor` int NOT NULL DEFAULT 100,
	`rounding_mode` enum('nearest','up') NOT NULL DEFAULT 'nearest',
	`labour_rate_minor_per_hour` int NOT NULL DEFAULT 4000,
	`tape_glue_s_per_part` double NOT NULL DEFAULT 40,
	`tab_s_per_tab` double NOT NULL DEFAULT 12,
	`skin_s_per_part` double NOT NULL DEFAULT 20,
	`clamps_s_per_sheet` double NOT NULL DEFAULT 120,
	`tape_cost_minor_per_m2` int NOT NULL DEFAULT 300,
	`glue_cost_minor_per_part` int NOT NULL DEFAULT 5,
	`calibration_runs` int NOT NULL DEFAULT 20,
	`calibration_min_runs` int NOT NULL DEFAULT 5,
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `shop_settings_shop_id` PRIMARY KEY(`shop_id`)
);
--> statement-breakpoint
ALTER TABLE `estimates` ADD `hold_methods_key` varchar(255);--> statement-breakpoint
ALTER TABLE `mail_log` ADD CONSTRAINT `mail_log_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `mail_log` ADD CONSTRAINT `mail_log_quote_id_quotes_id_fk` FOREIGN KEY (`quote_id`) REFERENCES `quotes`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `mail_log` ADD CONSTRAINT `mail_log_sent_by_users_id_fk` FOREIGN KEY (`sent_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quote_counters` ADD CONSTRAINT `quote_counters_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quotes` ADD CONSTRAINT `quotes_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quotes` ADD CONSTRAINT `quotes_job_id_jobs_id_fk` FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quotes` ADD CONSTRAINT `quotes_estimate_id_estimates_id_fk` FOREIGN KEY (`estimate_id`) REFERENCES `estimates`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `quotes` ADD CONSTRAINT `quotes_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_changes` ADD CONSTRAINT `run_changes_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_changes` ADD CONSTRAINT `run_changes_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_changes` ADD CONSTRAINT `run_changes_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_events` ADD CONSTRAINT `run_events_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_events` ADD CONSTRAINT `run_events_run_id_runs_id_fk` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_events` ADD CONSTRAINT `run_events_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_job_id_jobs_id_fk` FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_program_id_programs_id_fk` FOREIGN KEY (`program_id`) REFERENCES `programs`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_estimate_id_estimates_id_fk` FOREIGN KEY (`estimate_id`) REFERENCES `estimates`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_operator_id_users_id_fk` FOREIGN KEY (`operator_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_voided_by_users_id_fk` FOREIGN KEY (`voided_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `shop_settings` ADD CONSTRAINT `shop_settings_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `mail_log_shop_idx` ON `mail_log` (`shop_id`,`id`);--> statement-breakpoint
CREATE INDEX `mail_log_quote_idx` ON `mail_log` (`quote_id`);--> statement-breakpoint
CREATE INDEX `quotes_job_idx` ON `quotes` (`job_id`,`id`);--> statement-breakpoint
CREATE INDEX `run_changes_run_idx` ON `run_changes` (`run_id`,`id`);--> statement-breakpoint
CREATE INDEX `run_events_run_idx` ON `run_events` (`run_id`,`at`);--> statement-breakpoint
CREATE INDEX `runs_shop_machine_idx` ON `runs` (`shop_id`,`machine_id`,`finished_at`);--> statement-breakpoint
CREATE INDEX `runs_program_idx` ON `runs` (`program_id`,`program_version`);