CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` text NOT NULL,
	`at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`user_id` text,
	`user_name` text,
	`kind` text NOT NULL,
	`action` text NOT NULL,
	`subject` text NOT NULL,
	`subject_id` text,
	`detail` text DEFAULT '' NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `audit_log_project_idx` ON `audit_log` (`project_id`,`at`);--> statement-breakpoint
CREATE TABLE `recipe_notes` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_id` text NOT NULL,
	`kind` text NOT NULL,
	`user_id` text,
	`body` text DEFAULT '' NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `recipe_notes_recipe_idx` ON `recipe_notes` (`recipe_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `recipe_weak_zones` (
	`recipe_hash` text NOT NULL,
	`property` text NOT NULL,
	`threshold` text NOT NULL,
	`min_length` text NOT NULL,
	`boundary` text DEFAULT '' NOT NULL,
	`figures` text NOT NULL,
	`map` blob NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	PRIMARY KEY(`recipe_hash`, `property`, `threshold`, `min_length`, `boundary`)
);
--> statement-breakpoint
ALTER TABLE `recipes` ADD `approved_by` text REFERENCES users(id) ON DELETE set null;--> statement-breakpoint
ALTER TABLE `recipes` ADD `approved_by_name` text;--> statement-breakpoint
ALTER TABLE `recipes` ADD `approved_at` integer;--> statement-breakpoint
ALTER TABLE `recipes` ADD `approved_hash` text;