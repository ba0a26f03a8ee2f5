-- Saved deck versions, analysis results and the audit log are append-only.
CREATE TRIGGER deck_versions_no_update BEFORE UPDATE ON deck_versions
BEGIN SELECT RAISE(ABORT, 'deck versions are immutable'); END;
--> statement-breakpoint
CREATE TRIGGER deck_versions_no_delete BEFORE DELETE ON deck_versions
BEGIN SELECT RAISE(ABORT, 'deck versions are immutable'); END;
--> statement-breakpoint
CREATE TRIGGER analysis_results_no_update BEFORE UPDATE ON analysis_results
BEGIN SELECT RAISE(ABORT, 'analysis results are immutable'); END;
--> statement-breakpoint
CREATE TRIGGER analysis_results_no_delete BEFORE DELETE ON analysis_results
BEGIN SELECT RAISE(ABORT, 'analysis results are immutable'); END;
--> statement-breakpoint
CREATE TRIGGER audit_log_no_update BEFORE UPDATE ON audit_log
BEGIN SELECT RAISE(ABORT, 'the audit log cannot be edited'); END;
--> statement-breakpoint
CREATE TRIGGER audit_log_no_delete BEFORE DELETE ON audit_log
BEGIN SELECT RAISE(ABORT, 'the audit log cannot be edited'); END;
