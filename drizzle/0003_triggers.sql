CREATE TABLE `triggers` (
	`id` text PRIMARY KEY NOT NULL,
	`candidate_id` text NOT NULL,
	`source` text NOT NULL,
	`external_id` text NOT NULL,
	`current_revision` integer NOT NULL,
	`stage` text NOT NULL,
	`event_time` integer NOT NULL,
	`received_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`withdrawn_at` integer,
	`network_snr` real NOT NULL,
	`false_alarm_rate_per_year` real NOT NULL,
	`detectors` text NOT NULL,
	`chirp_mass_detector_frame` real,
	`dominant_class` text,
	FOREIGN KEY (`candidate_id`) REFERENCES `candidates`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `triggers_source_external_unique` ON `triggers` (`source`,`external_id`);--> statement-breakpoint
CREATE INDEX `triggers_event_time_idx` ON `triggers` (`event_time`);--> statement-breakpoint
CREATE INDEX `triggers_candidate_idx` ON `triggers` (`candidate_id`);--> statement-breakpoint
DROP INDEX `candidate_revisions_unique`;--> statement-breakpoint
ALTER TABLE `candidate_revisions` ADD `trigger_id` text REFERENCES triggers(id) ON DELETE cascade;--> statement-breakpoint
CREATE UNIQUE INDEX `candidate_revisions_trigger_unique` ON `candidate_revisions` (`trigger_id`,`revision`);--> statement-breakpoint
CREATE INDEX `candidate_revisions_candidate_idx` ON `candidate_revisions` (`candidate_id`);--> statement-breakpoint
DROP INDEX `candidates_source_external_unique`;--> statement-breakpoint
ALTER TABLE `candidates` ADD `preferred_trigger_id` text;--> statement-breakpoint
ALTER TABLE `candidates` ADD `trigger_count` integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `candidates` ADD `merged_into_id` text;--> statement-breakpoint
CREATE INDEX `candidates_source_external_idx` ON `candidates` (`source`,`external_id`);--> statement-breakpoint
-- Existing data: every candidate becomes one trigger with the candidate's own id, preferred, holding its revisions.
INSERT INTO `triggers` (`id`, `candidate_id`, `source`, `external_id`, `current_revision`, `stage`, `event_time`, `received_at`, `updated_at`, `withdrawn_at`, `network_snr`, `false_alarm_rate_per_year`, `detectors`, `chirp_mass_detector_frame`, `dominant_class`)
  SELECT `id`, `id`, `source`, `external_id`, `current_revision`, `stage`, `event_time`, `received_at`, `updated_at`, `withdrawn_at`, `network_snr`, `false_alarm_rate_per_year`, `detectors`, `chirp_mass_detector_frame`, `dominant_class` FROM `candidates`;--> statement-breakpoint
UPDATE `candidate_revisions` SET `trigger_id` = `candidate_id`;--> statement-breakpoint
UPDATE `candidates` SET `preferred_trigger_id` = `id`, `trigger_count` = 1;