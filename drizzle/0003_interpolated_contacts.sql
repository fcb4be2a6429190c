ALTER TABLE `contacts` ADD `interpolated` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `soundings` ADD `contacts_edited` integer DEFAULT false NOT NULL;