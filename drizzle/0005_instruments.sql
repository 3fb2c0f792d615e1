CREATE TABLE `instruments` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`footprint` text NOT NULL,
	`filters` text NOT NULL,
	`exposure_s` integer NOT NULL,
	`overhead_s` integer NOT NULL,
	`limiting_mag` real,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `instruments_site_idx` ON `instruments` (`site_id`);--> statement-breakpoint
-- Each existing site gets one square instrument of its old field-of-view area (side = sqrt(area)); exposure 60 s and
-- overhead 30 s are placeholders a coordinator edits on the sites page.
INSERT INTO `instruments` (`id`, `site_id`, `name`, `footprint`, `filters`, `exposure_s`, `overhead_s`, `limiting_mag`, `created_at`)
SELECT lower(hex(randomblob(4)) || '-' || hex(randomblob(2)) || '-4' || substr(hex(randomblob(2)), 2) || '-8' || substr(hex(randomblob(2)), 2) || '-' || hex(randomblob(6))),
  `id`, 'Main camera', json_object('shape', 'rectangle', 'widthDeg', sqrt(`field_of_view_deg2`), 'heightDeg', sqrt(`field_of_view_deg2`)), '[]', 60, 30, NULL, `created_at`
FROM `sites`;
