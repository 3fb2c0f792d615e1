CREATE TABLE `plan_pointings` (
	`id` text PRIMARY KEY NOT NULL,
	`plan_id` text NOT NULL,
	`index` integer NOT NULL,
	`ra_deg` real NOT NULL,
	`dec_deg` real NOT NULL,
	`probability` real NOT NULL,
	`gained_probability` real NOT NULL,
	`cumulative_probability` real NOT NULL,
	`planned_start` integer,
	`planned_end` integer,
	`altitude_deg` real,
	`airmass` real,
	`moon_separation_deg` real,
	`unscheduled_reason` text,
	`done_at` integer,
	`done_by_id` text,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`done_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `plan_pointings_plan_index_unique` ON `plan_pointings` (`plan_id`,`index`);--> statement-breakpoint
CREATE TABLE `plans` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`skymap_id` text NOT NULL,
	`instrument_id` text,
	`site_id` text,
	`task_id` text,
	`instrument_name` text NOT NULL,
	`footprint` text NOT NULL,
	`exposure_s` integer NOT NULL,
	`overhead_s` integer NOT NULL,
	`filter` text,
	`level` real NOT NULL,
	`max_pointings` integer NOT NULL,
	`avoid` text NOT NULL,
	`moon_distance_deg` real NOT NULL,
	`window_start` integer NOT NULL,
	`window_end` integer NOT NULL,
	`total_probability` real NOT NULL,
	`scheduled_probability` real NOT NULL,
	`avoided_probability` real NOT NULL,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	`closed_at` integer,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`skymap_id`) REFERENCES `skymaps`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`instrument_id`) REFERENCES `instruments`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`task_id`) REFERENCES `follow_up_tasks`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `plans_candidate_idx` ON `plans` (`candidate_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `plans_task_idx` ON `plans` (`task_id`);--> statement-breakpoint
CREATE INDEX `plans_site_idx` ON `plans` (`site_id`);