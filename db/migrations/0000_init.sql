CREATE TABLE `customers` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`name` varchar(160) NOT NULL,
	`email` varchar(190) NOT NULL,
	`phone` varchar(40) NOT NULL DEFAULT '',
	`notes` text,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `customers_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `jobs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`title` varchar(160) NOT NULL,
	`customer_id` int NOT NULL,
	`material_id` int,
	`sheet_width_mm` double NOT NULL,
	`sheet_length_mm` double NOT NULL,
	`sheet_thickness_mm` double NOT NULL,
	`z_zero` enum('top','table') NOT NULL DEFAULT 'top',
	`hold_down` enum('vacuum','tape-glue','clamps','tabs','skin') NOT NULL,
	`vacuum_kpa` double,
	`quantity` int NOT NULL,
	`status` enum('draft','programmed','quoted','accepted','running','done','cancelled') NOT NULL DEFAULT 'draft',
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `jobs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `machine_versions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`version` int NOT NULL,
	`profile` json NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `machine_versions_id` PRIMARY KEY(`id`),
	CONSTRAINT `machine_versions_unique` UNIQUE(`machine_id`,`version`)
);
--> statement-breakpoint
CREATE TABLE `machines` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`name` varchar(120) NOT NULL,
	`version` int NOT NULL DEFAULT 1,
	`travel_x_mm` double NOT NULL,
	`travel_y_mm` double NOT NULL,
	`travel_z_mm` double NOT NULL,
	`home_x_mm` double NOT NULL DEFAULT 0,
	`home_y_mm` double NOT NULL DEFAULT 0,
	`home_z_mm` double NOT NULL DEFAULT 0,
	`max_feed_x_mm_per_min` double NOT NULL,
	`max_feed_y_mm_per_min` double NOT NULL,
	`max_feed_z_mm_per_min` double NOT NULL,
	`rapid_x_mm_per_min` double NOT NULL,
	`rapid_y_mm_per_min` double NOT NULL,
	`rapid_z_mm_per_min` double NOT NULL,
	`accel_x_mm_per_s2` double NOT NULL,
	`accel_y_mm_per_s2` double NOT NULL,
	`accel_z_mm_per_s2` double NOT NULL,
	`junction_deviation_mm` double NOT NULL,
	`lookahead_blocks` int NOT NULL,
	`max_block_rate_per_s` double NOT NULL,
	`arc_tolerance_mm` double NOT NULL,
	`tool_change_s` double NOT NULL,
	`spindle_spin_up_s` double NOT NULL,
	`time_factor` double NOT NULL DEFAULT 1,
	`hourly_rate_minor` int NOT NULL DEFAULT 0,
	`default_hold_down` enum('vacuum','tape-glue','clamps','tabs','skin') NOT NULL DEFAULT 'vacuum',
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `machines_id` PRIMARY KEY(`id`),
	CONSTRAINT `machines_shop_name_unique` UNIQUE(`shop_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `materials` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`name` varchar(120) NOT NULL,
	`thickness_mm` double NOT NULL,
	`sheet_width_mm` double NOT NULL,
	`sheet_length_mm` double NOT NULL,
	`cost_per_sheet_minor` int NOT NULL,
	CONSTRAINT `materials_id` PRIMARY KEY(`id`),
	CONSTRAINT `materials_shop_name_unique` UNIQUE(`shop_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `shops` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`slug` varchar(60) NOT NULL,
	`currency` varchar(3) NOT NULL DEFAULT 'EUR',
	`created_at` timestamp NOT NULL DEFAULT (now()),
	CONSTRAINT `shops_id` PRIMARY KEY(`id`),
	CONSTRAINT `shops_slug_unique` UNIQUE(`slug`)
);
--> statement-breakpoint
CREATE TABLE `tools` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`number` int NOT NULL,
	`diameter_mm` double NOT NULL,
	`flutes` int NOT NULL,
	`kind` enum('upcut','downcut','compression','straight','v','ball') NOT NULL,
	`description` varchar(160) NOT NULL DEFAULT '',
	CONSTRAINT `tools_id` PRIMARY KEY(`id`),
	CONSTRAINT `tools_machine_number_unique` UNIQUE(`machine_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`email` varchar(190) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(100) NOT NULL,
	`role` enum('admin','programmer','estimator','operator') NOT NULL,
	`disabled` boolean NOT NULL DEFAULT false,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`updated_at` timestamp NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
ALTER TABLE `customers` ADD CONSTRAINT `customers_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_customer_id_customers_id_fk` FOREIGN KEY (`customer_id`) REFERENCES `customers`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_material_id_materials_id_fk` FOREIGN KEY (`material_id`) REFERENCES `materials`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `machine_versions` ADD CONSTRAINT `machine_versions_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `machine_versions` ADD CONSTRAINT `machine_versions_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `machines` ADD CONSTRAINT `machines_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `materials` ADD CONSTRAINT `materials_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tools` ADD CONSTRAINT `tools_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tools` ADD CONSTRAINT `tools_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `customers_shop_idx` ON `customers` (`shop_id`);--> statement-breakpoint
CREATE INDEX `jobs_shop_idx` ON `jobs` (`shop_id`);--> statement-breakpoint
CREATE INDEX `users_shop_idx` ON `users` (`shop_id`);