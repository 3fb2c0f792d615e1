CREATE TABLE `galaxy_cells` (
	`id` integer PRIMARY KEY NOT NULL,
	`catalogue_id` text NOT NULL,
	`cell` integer NOT NULL,
	`count` integer NOT NULL,
	`data` blob NOT NULL,
	FOREIGN KEY (`catalogue_id`) REFERENCES `catalogues`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `galaxy_cells_catalogue_cell_idx` ON `galaxy_cells` (`catalogue_id`,`cell`);