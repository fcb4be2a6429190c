CREATE TABLE `recipe_summaries` (
	`recipe_hash` text NOT NULL,
	`stat` text NOT NULL,
	`threshold` text DEFAULT '' NOT NULL,
	`realizations` integer NOT NULL,
	`values` blob NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	PRIMARY KEY(`recipe_hash`, `stat`, `threshold`)
);
--> statement-breakpoint
CREATE TABLE `recipes` (
	`id` text PRIMARY KEY NOT NULL,
	`project_id` text NOT NULL,
	`name` text NOT NULL,
	`kind` text DEFAULT 'sgs' NOT NULL,
	`zonation_id` text,
	`hash` text NOT NULL,
	`engine_version` text NOT NULL,
	`realizations` integer NOT NULL,
	`status` text DEFAULT 'ready' NOT NULL,
	`document` text NOT NULL,
	`setup` text NOT NULL,
	`provenance` text NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`zonation_id`) REFERENCES `zonations`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipes_project_hash_idx` ON `recipes` (`project_id`,`hash`);