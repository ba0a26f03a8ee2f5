CREATE TABLE `sign_in_refusals` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`limit_name` text NOT NULL,
	`email` text,
	`address` text NOT NULL,
	`firm_id` integer,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sign_in_refusals_at_idx` ON `sign_in_refusals` (`at`);