-- Sessions were stateless JWTs, so this table has always been empty; clearing it lets SQLite add the columns below
-- (it refuses a non-constant default on a table with rows).
DELETE FROM `sessions`;--> statement-breakpoint
ALTER TABLE `sessions` ADD `created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `last_seen_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `user_agent` text;--> statement-breakpoint
ALTER TABLE `sessions` ADD `address` text;--> statement-breakpoint
ALTER TABLE `sessions` ADD `revoked_at` integer;--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);