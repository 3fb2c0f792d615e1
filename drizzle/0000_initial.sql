CREATE TABLE `api_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`label` text NOT NULL,
	`token_hash` text NOT NULL,
	`prefix` text NOT NULL,
	`created_at` integer NOT NULL,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_tokens_hash_unique` ON `api_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `api_tokens_user_idx` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE TABLE `sign_in_attempts` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`bucket` text NOT NULL,
	`at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sign_in_attempts_bucket_at_idx` ON `sign_in_attempts` (`bucket`,`at`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`role` text NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`initials` text DEFAULT '' NOT NULL,
	`disabled_at` integer,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE TABLE `candidate_notes` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`author_id` text NOT NULL,
	`body` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `candidate_notes_candidate_idx` ON `candidate_notes` (`candidate_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `candidate_revisions` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`revision` integer NOT NULL,
	`stage` text NOT NULL,
	`event_time` integer NOT NULL,
	`received_at` integer NOT NULL,
	`payload` text NOT NULL,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `candidate_revisions_unique` ON `candidate_revisions` (`candidate_id`,`revision`);--> statement-breakpoint
CREATE TABLE `candidates` (
	`id` text PRIMARY KEY NOT NULL,
	`source` text NOT NULL,
	`external_id` text NOT NULL,
	`current_revision` integer NOT NULL,
	`stage` text NOT NULL,
	`triage_state` text DEFAULT 'new' NOT NULL,
	`owner_id` text,
	`event_time` integer NOT NULL,
	`received_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`acknowledged_at` integer,
	`acknowledged_by_id` text,
	`decided_at` integer,
	`dismiss_reason` text,
	`withdrawn_at` integer,
	`network_snr` real NOT NULL,
	`false_alarm_rate_per_year` real NOT NULL,
	`detectors` text NOT NULL,
	`chirp_mass_detector_frame` real,
	`dominant_class` text,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`acknowledged_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `candidates_source_external_unique` ON `candidates` (`source`,`external_id`);--> statement-breakpoint
CREATE INDEX `candidates_received_idx` ON `candidates` (`received_at`);--> statement-breakpoint
CREATE INDEX `candidates_triage_idx` ON `candidates` (`triage_state`,`received_at`);--> statement-breakpoint
CREATE INDEX `candidates_event_time_idx` ON `candidates` (`event_time`);--> statement-breakpoint
CREATE TABLE `dead_letters` (
	`id` text PRIMARY KEY NOT NULL,
	`received_at` integer NOT NULL,
	`status_code` integer NOT NULL,
	`reason` text NOT NULL,
	`issues` text,
	`raw_body` text NOT NULL,
	`source` text,
	`external_id` text
);
--> statement-breakpoint
CREATE INDEX `dead_letters_received_idx` ON `dead_letters` (`received_at`);--> statement-breakpoint
CREATE TABLE `derived_quantities` (
	`revision_id` text PRIMARY KEY NOT NULL,
	`chirp_mass_detector_frame` real,
	`chirp_mass_detector_frame_sd` real,
	`p_bns` real,
	`p_nsbh` real,
	`p_bbh` real,
	`p_lower_gap` real,
	`redshift` real,
	`derived` text NOT NULL,
	`computed_at` integer NOT NULL,
	FOREIGN KEY (`revision_id`) REFERENCES `candidate_revisions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `follow_up_tasks` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`kind` text NOT NULL,
	`site_id` text,
	`window_start` integer,
	`window_end` integer,
	`priority` integer DEFAULT 2 NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`claimed_by_id` text,
	`claimed_at` integer,
	`observing_at` integer,
	`reported_at` integer,
	`cancelled_at` integer,
	`result` text,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`claimed_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `follow_up_tasks_candidate_idx` ON `follow_up_tasks` (`candidate_id`);--> statement-breakpoint
CREATE INDEX `follow_up_tasks_state_idx` ON `follow_up_tasks` (`state`,`created_at`);--> statement-breakpoint
CREATE INDEX `follow_up_tasks_site_idx` ON `follow_up_tasks` (`site_id`);--> statement-breakpoint
CREATE INDEX `follow_up_tasks_claimed_by_idx` ON `follow_up_tasks` (`claimed_by_id`);--> statement-breakpoint
CREATE TABLE `site_observers` (
	`site_id` text NOT NULL,
	`user_id` text NOT NULL,
	PRIMARY KEY(`site_id`, `user_id`),
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`latitude_deg` real NOT NULL,
	`longitude_deg` real NOT NULL,
	`elevation_m` real NOT NULL,
	`min_altitude_deg` real DEFAULT 30 NOT NULL,
	`field_of_view_deg2` real NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sites_code_unique` ON `sites` (`code`);--> statement-breakpoint
CREATE TABLE `events` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`at` integer NOT NULL,
	`actor_id` text,
	`kind` text NOT NULL,
	`candidate_id` text,
	`task_id` text,
	`from_state` text,
	`to_state` text,
	`data` text,
	FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `events_candidate_idx` ON `events` (`candidate_id`,`id`);--> statement-breakpoint
CREATE INDEX `events_task_idx` ON `events` (`task_id`);--> statement-breakpoint
CREATE INDEX `events_kind_at_idx` ON `events` (`kind`,`at`);--> statement-breakpoint
CREATE INDEX `events_at_idx` ON `events` (`at`);--> statement-breakpoint
CREATE TABLE `ack_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`user_id` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `escalations` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`step` integer NOT NULL,
	`target` text NOT NULL,
	`due_at` integer NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`fired_at` integer,
	`locked_by` text,
	`locked_until` integer,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `escalations_candidate_step_unique` ON `escalations` (`candidate_id`,`step`);--> statement-breakpoint
CREATE INDEX `escalations_due_idx` ON `escalations` (`status`,`due_at`);--> statement-breakpoint
CREATE TABLE `notification_preferences` (
	`user_id` text PRIMARY KEY NOT NULL,
	`preferences` text NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `notifications` (
	`id` text PRIMARY KEY NOT NULL,
	`dedupe_key` text NOT NULL,
	`event_id` integer,
	`user_id` text,
	`address` text,
	`channel` text NOT NULL,
	`kind` text NOT NULL,
	`candidate_id` text,
	`task_id` text,
	`title` text NOT NULL,
	`body` text NOT NULL,
	`url` text,
	`payload` text,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` integer NOT NULL,
	`locked_by` text,
	`locked_until` integer,
	`last_error` text,
	`sent_at` integer,
	`read_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notifications_dedupe_unique` ON `notifications` (`dedupe_key`);--> statement-breakpoint
CREATE INDEX `notifications_due_idx` ON `notifications` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `notifications_user_idx` ON `notifications` (`user_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `notifications_candidate_idx` ON `notifications` (`candidate_id`);--> statement-breakpoint
CREATE TABLE `push_subscriptions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`endpoint` text NOT NULL,
	`p256dh` text NOT NULL,
	`auth` text NOT NULL,
	`label` text DEFAULT '' NOT NULL,
	`created_at` integer NOT NULL,
	`last_success_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `push_subscriptions_endpoint_unique` ON `push_subscriptions` (`endpoint`);--> statement-breakpoint
CREATE INDEX `push_subscriptions_user_idx` ON `push_subscriptions` (`user_id`);--> statement-breakpoint
CREATE TABLE `shifts` (
	`id` text PRIMARY KEY NOT NULL,
	`starts_at` integer NOT NULL,
	`ends_at` integer NOT NULL,
	`primary_id` text NOT NULL,
	`backup_id` text,
	`notes` text DEFAULT '' NOT NULL,
	`handoff_queued_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`primary_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`backup_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `shifts_range_idx` ON `shifts` (`starts_at`,`ends_at`);--> statement-breakpoint
CREATE TABLE `skymaps` (
	`id` text PRIMARY KEY NOT NULL,
	`upload_id` text NOT NULL,
	`candidate_id` text NOT NULL,
	`revision_id` text,
	`layout` text NOT NULL,
	`nside` integer,
	`pixel_count` integer NOT NULL,
	`total_probability` real NOT NULL,
	`area50_deg2` real NOT NULL,
	`area90_deg2` real NOT NULL,
	`peak_ra_deg` real NOT NULL,
	`peak_dec_deg` real NOT NULL,
	`warnings` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `candidate_revisions`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `skymaps_candidate_idx` ON `skymaps` (`candidate_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `task_report_files` (
	`id` text PRIMARY KEY NOT NULL,
	`report_id` text NOT NULL,
	`upload_id` text NOT NULL,
	FOREIGN KEY (`report_id`) REFERENCES `task_reports`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `task_reports` (
	`id` text PRIMARY KEY NOT NULL,
	`task_id` text NOT NULL,
	`author_id` text,
	`result` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`task_id`) REFERENCES `follow_up_tasks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `task_reports_task_idx` ON `task_reports` (`task_id`);--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` text PRIMARY KEY NOT NULL,
	`sha256` text NOT NULL,
	`kind` text NOT NULL,
	`original_name` text NOT NULL,
	`mime_type` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`uploaded_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `uploads_sha_idx` ON `uploads` (`sha256`);--> statement-breakpoint
CREATE TABLE `settings` (
	`key` text PRIMARY KEY NOT NULL,
	`value` text NOT NULL,
	`updated_at` integer NOT NULL,
	`updated_by_id` text,
	FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
