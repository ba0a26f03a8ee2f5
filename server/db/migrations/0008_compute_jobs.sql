CREATE TABLE `compute_jobs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`kind` text NOT NULL,
	`version_id` integer NOT NULL,
	`requested_by` integer,
	`state` text DEFAULT 'queued' NOT NULL,
	`solver_version` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`started_at` text,
	`finished_at` text,
	`run_ms` real,
	`error` text,
	FOREIGN KEY (`version_id`) REFERENCES `deck_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`requested_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `compute_jobs_version` ON `compute_jobs` (`version_id`);--> statement-breakpoint
CREATE INDEX `compute_jobs_state` ON `compute_jobs` (`state`);