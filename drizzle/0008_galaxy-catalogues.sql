CREATE TABLE `catalogues` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`state` text NOT NULL,
	`is_default` integer DEFAULT false NOT NULL,
	`row_count` integer DEFAULT 0 NOT NULL,
	`uploaded_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `catalogues_one_default` ON `catalogues` (`is_default`) WHERE "catalogues"."is_default" = 1;--> statement-breakpoint
CREATE TABLE `galaxies` (
	`id` integer PRIMARY KEY NOT NULL,
	`catalogue_id` text NOT NULL,
	`cell` integer NOT NULL,
	`name` text NOT NULL,
	`ra_deg` real NOT NULL,
	`dec_deg` real NOT NULL,
	`distance_mpc` real NOT NULL,
	`weight` real NOT NULL,
	FOREIGN KEY (`catalogue_id`) REFERENCES `catalogues`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `galaxies_catalogue_cell_idx` ON `galaxies` (`catalogue_id`,`cell`);