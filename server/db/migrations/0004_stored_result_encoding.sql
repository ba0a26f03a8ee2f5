CREATE TABLE `firm_storage` (
	`firm_id` integer PRIMARY KEY NOT NULL,
	`bytes` integer DEFAULT 0 NOT NULL,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
ALTER TABLE `analysis_results` ADD `encoding` text DEFAULT 'json' NOT NULL;--> statement-breakpoint
ALTER TABLE `analysis_results` ADD `data_blob` blob;