ALTER TABLE `assignments` ADD `results_opened_at` text;--> statement-breakpoint
ALTER TABLE `assignments` ADD `results_opened_by` integer REFERENCES users(id);--> statement-breakpoint
-- An exercise opened to all stays open: its answer has been shown.
CREATE TRIGGER assignments_stay_open BEFORE UPDATE OF results_opened_at ON assignments
WHEN OLD.results_opened_at IS NOT NULL AND NEW.results_opened_at IS NOT OLD.results_opened_at
BEGIN SELECT RAISE(ABORT, 'an exercise opened to all stays open'); END;
