CREATE TABLE `studies` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`version_id` integer NOT NULL,
	`name` text NOT NULL,
	`sweep_json` text NOT NULL,
	`state` text DEFAULT 'running' NOT NULL,
	`points_total` integer NOT NULL,
	`points_done` integer DEFAULT 0 NOT NULL,
	`solver_version` text NOT NULL,
	`created_by` integer NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`finished_at` text,
	`cancelled_by` text,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`version_id`) REFERENCES `deck_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `studies_project_idx` ON `studies` (`project_id`);--> statement-breakpoint
CREATE TABLE `study_points` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`study_id` integer NOT NULL,
	`point_index` integer NOT NULL,
	`values_json` text NOT NULL,
	`summary_json` text,
	`error` text,
	`solver_version` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`study_id`) REFERENCES `studies`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `study_points_study_index_unique` ON `study_points` (`study_id`,`point_index`);