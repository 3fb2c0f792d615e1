CREATE TABLE `counterparts` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`ra_deg` real NOT NULL,
	`dec_deg` real NOT NULL,
	`observed_at` integer NOT NULL,
	`magnitude` real,
	`magnitude_error` real,
	`filter` text,
	`name` text,
	`notes` text NOT NULL,
	`reported_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`reported_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `counterparts_candidate_idx` ON `counterparts` (`candidate_id`,`observed_at`);--> statement-breakpoint
CREATE TABLE `observations` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`task_id` text,
	`instrument_id` text,
	`site_id` text,
	`ra_deg` real NOT NULL,
	`dec_deg` real NOT NULL,
	`footprint` text NOT NULL,
	`start_time` integer NOT NULL,
	`exposure_s` real NOT NULL,
	`filter` text NOT NULL,
	`limiting_magnitude` real,
	`pointing_index` integer,
	`source` text NOT NULL,
	`recorded_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`task_id`) REFERENCES `follow_up_tasks`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`instrument_id`) REFERENCES `instruments`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`recorded_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `observations_candidate_idx` ON `observations` (`candidate_id`,`start_time`);--> statement-breakpoint
CREATE INDEX `observations_task_idx` ON `observations` (`task_id`);