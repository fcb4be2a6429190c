CREATE TABLE `contacts` (
	`sounding_id` text NOT NULL,
	`unit_id` text NOT NULL,
	`top_elevation` real NOT NULL,
	PRIMARY KEY(`sounding_id`, `unit_id`),
	FOREIGN KEY (`sounding_id`) REFERENCES `soundings`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `contacts_unit_idx` ON `contacts` (`unit_id`);--> statement-breakpoint
CREATE TABLE `domain_members` (
	`domain_id` text NOT NULL,
	`unit_id` text NOT NULL,
	`zone` integer DEFAULT -1 NOT NULL,
	PRIMARY KEY(`domain_id`, `unit_id`, `zone`),
	FOREIGN KEY (`domain_id`) REFERENCES `domains`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `domains` (
	`id` text PRIMARY KEY NOT NULL,
	`zonation_id` text NOT NULL,
	`name` text NOT NULL,
	`position` integer DEFAULT 0 NOT NULL,
	`property` text NOT NULL,
	`cell_height` real,
	`averaging` text DEFAULT 'none' NOT NULL,
	`decluster_cell` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`zonation_id`) REFERENCES `zonations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `domains_zonation_name_idx` ON `domains` (`zonation_id`,`name`);--> statement-breakpoint
CREATE TABLE `site_settings` (
	`project_id` text PRIMARY KEY NOT NULL,
	`geometry` text DEFAULT '2d' NOT NULL,
	`section_line` text,
	`off_line_tolerance` real DEFAULT 25 NOT NULL,
	`groundwater_elevation` real,
	`updated_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `soundings` (
	`id` text PRIMARY KEY NOT NULL,
	`project_id` text NOT NULL,
	`source_file_id` text,
	`name` text NOT NULL,
	`x` real,
	`y` real,
	`chainage` real,
	`ground_elevation` real NOT NULL,
	`area_ratio` real DEFAULT 0.8 NOT NULL,
	`groundwater_elevation` real,
	`readings` integer NOT NULL,
	`max_depth` real NOT NULL,
	`max_qc` real NOT NULL,
	`depth` blob NOT NULL,
	`qc` blob NOT NULL,
	`fs` blob NOT NULL,
	`u2` blob,
	`extras` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`source_file_id`) REFERENCES `source_files`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `soundings_project_name_idx` ON `soundings` (`project_id`,`name`);--> statement-breakpoint
CREATE TABLE `source_files` (
	`id` text PRIMARY KEY NOT NULL,
	`project_id` text NOT NULL,
	`name` text NOT NULL,
	`format` text NOT NULL,
	`sha256` text NOT NULL,
	`size` integer NOT NULL,
	`bytes` blob NOT NULL,
	`mapping` text,
	`uploaded_by` text,
	`uploaded_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `source_files_project_sha_idx` ON `source_files` (`project_id`,`sha256`);--> statement-breakpoint
CREATE TABLE `units` (
	`id` text PRIMARY KEY NOT NULL,
	`project_id` text NOT NULL,
	`name` text NOT NULL,
	`colour` text NOT NULL,
	`position` integer NOT NULL,
	`gamma_above` real DEFAULT 18 NOT NULL,
	`gamma_below` real DEFAULT 19 NOT NULL,
	`nkt` real DEFAULT 14 NOT NULL,
	`cfc` real DEFAULT 0 NOT NULL,
	`property` text DEFAULT 'qc1Ncs' NOT NULL,
	`zone_names` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `units_project_name_idx` ON `units` (`project_id`,`name`);--> statement-breakpoint
CREATE TABLE `variogram_comments` (
	`id` text PRIMARY KEY NOT NULL,
	`variogram_id` text NOT NULL,
	`user_id` text,
	`body` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`variogram_id`) REFERENCES `variograms`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE TABLE `variograms` (
	`id` text PRIMARY KEY NOT NULL,
	`domain_id` text NOT NULL,
	`name` text NOT NULL,
	`version` integer NOT NULL,
	`model` text NOT NULL,
	`settings` text NOT NULL,
	`misfit` real,
	`note` text DEFAULT '' NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`domain_id`) REFERENCES `domains`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `variograms_domain_name_version_idx` ON `variograms` (`domain_id`,`name`,`version`);--> statement-breakpoint
CREATE TABLE `zonations` (
	`id` text PRIMARY KEY NOT NULL,
	`project_id` text NOT NULL,
	`name` text NOT NULL,
	`description` text DEFAULT '' NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `zonations_project_name_idx` ON `zonations` (`project_id`,`name`);--> statement-breakpoint
CREATE TABLE `zone_boundaries` (
	`id` text PRIMARY KEY NOT NULL,
	`unit_id` text NOT NULL,
	`chainage_top` real NOT NULL,
	`elevation_top` real NOT NULL,
	`chainage_bottom` real NOT NULL,
	`elevation_bottom` real NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`unit_id`) REFERENCES `units`(`id`) ON UPDATE no action ON DELETE cascade
);
