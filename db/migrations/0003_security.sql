CREATE TABLE `sign_in_limits` (
	`key_hash` char(64) NOT NULL,
	`kind` enum('email','ip') NOT NULL,
	`attempts` int NOT NULL,
	`expires_at` timestamp(3) NOT NULL,
	CONSTRAINT `sign_in_limits_key_hash` PRIMARY KEY(`key_hash`)
);
--> statement-breakpoint
CREATE TABLE `user_sessions` (
	`id` char(32) NOT NULL,
	`shop_id` int NOT NULL,
	`user_id` int NOT NULL,
	`created_at` timestamp NOT NULL DEFAULT (now()),
	`last_seen_at` timestamp NOT NULL DEFAULT (now()),
	`ended_at` timestamp,
	CONSTRAINT `user_sessions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `users` DROP INDEX `users_email_unique`;--> statement-breakpoint
ALTER TABLE `users` ADD `must_change_password` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_shop_email_unique` UNIQUE(`shop_id`,`email`);--> statement-breakpoint
-- the unique index above now serves the shop_id foreign key, so the old one can go
DROP INDEX `users_shop_idx` ON `users`;--> statement-breakpoint
ALTER TABLE `user_sessions` ADD CONSTRAINT `user_sessions_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `user_sessions` ADD CONSTRAINT `user_sessions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `sign_in_limits_expires_idx` ON `sign_in_limits` (`expires_at`);--> statement-breakpoint
CREATE INDEX `user_sessions_user_idx` ON `user_sessions` (`user_id`);--> statement-breakpoint
CREATE INDEX `user_sessions_seen_idx` ON `user_sessions` (`last_seen_at`);--> statement-breakpoint
CREATE INDEX `users_email_idx` ON `users` (`email`);