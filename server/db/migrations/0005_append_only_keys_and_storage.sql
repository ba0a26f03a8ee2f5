-- Append-only tables refuse any INSERT whose key already exists. SQLite resolves a conflict
-- of INSERT OR REPLACE / REPLACE INTO by deleting the old row, which fires no DELETE trigger
-- unless recursive_triggers is on; an upsert (ON CONFLICT DO UPDATE) is refused by the UPDATE
-- triggers, and by these too. The check runs before the conflict is resolved, on every
-- connection, whatever its pragmas.
CREATE TRIGGER deck_versions_no_replace BEFORE INSERT ON deck_versions
WHEN EXISTS (SELECT 1 FROM deck_versions WHERE id = NEW.id OR (deck_id = NEW.deck_id AND number = NEW.number))
BEGIN SELECT RAISE(ABORT, 'deck versions are immutable: this version already exists'); END;
--> statement-breakpoint
CREATE TRIGGER analysis_results_no_replace BEFORE INSERT ON analysis_results
WHEN EXISTS (SELECT 1 FROM analysis_results WHERE id = NEW.id OR (version_id = NEW.version_id AND method = NEW.method AND solver_version = NEW.solver_version))
BEGIN SELECT RAISE(ABORT, 'analysis results are immutable: this result is already stored'); END;
--> statement-breakpoint
CREATE TRIGGER audit_log_no_replace BEFORE INSERT ON audit_log
WHEN EXISTS (SELECT 1 FROM audit_log WHERE id = NEW.id)
BEGIN SELECT RAISE(ABORT, 'the audit log cannot be edited: this entry already exists'); END;
--> statement-breakpoint
CREATE TRIGGER review_comments_no_replace BEFORE INSERT ON review_comments
WHEN EXISTS (SELECT 1 FROM review_comments WHERE id = NEW.id)
BEGIN SELECT RAISE(ABORT, 'review comments cannot be edited: this comment already exists'); END;
--> statement-breakpoint
CREATE TRIGGER submissions_no_replace BEFORE INSERT ON submissions
WHEN EXISTS (SELECT 1 FROM submissions WHERE id = NEW.id OR (assignment_id = NEW.assignment_id AND trainee_id = NEW.trainee_id AND attempt = NEW.attempt))
BEGIN SELECT RAISE(ABORT, 'submissions cannot be changed: this attempt already exists'); END;
--> statement-breakpoint
CREATE TRIGGER outbox_messages_no_replace BEFORE INSERT ON outbox_messages
WHEN EXISTS (SELECT 1 FROM outbox_messages WHERE id = NEW.id)
BEGIN SELECT RAISE(ABORT, 'outbox messages cannot be changed: this message already exists'); END;
--> statement-breakpoint
CREATE TRIGGER outbox_messages_no_delete BEFORE DELETE ON outbox_messages
BEGIN SELECT RAISE(ABORT, 'outbox messages cannot be deleted'); END;
--> statement-breakpoint
-- Stored bytes per firm: what each firm's deck versions and results hold, counted on insert
-- (rows are never updated or deleted, so the count only grows). Older rows are counted once here.
INSERT INTO firm_storage (firm_id, bytes)
SELECT f.id,
  COALESCE((SELECT SUM(length(CAST(v.deck_json AS BLOB)) + COALESCE(length(CAST(v.placements_json AS BLOB)), 0))
    FROM deck_versions v JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id WHERE p.firm_id = f.id), 0)
  + COALESCE((SELECT SUM(length(CAST(r.data_json AS BLOB)) + COALESCE(length(r.data_blob), 0))
    FROM analysis_results r JOIN deck_versions v ON v.id = r.version_id JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id WHERE p.firm_id = f.id), 0)
FROM firms f;
--> statement-breakpoint
CREATE TRIGGER firms_storage_row AFTER INSERT ON firms
BEGIN INSERT INTO firm_storage (firm_id, bytes) VALUES (NEW.id, 0); END;
--> statement-breakpoint
CREATE TRIGGER deck_versions_count_storage AFTER INSERT ON deck_versions
BEGIN
  UPDATE firm_storage SET bytes = bytes + length(CAST(NEW.deck_json AS BLOB)) + COALESCE(length(CAST(NEW.placements_json AS BLOB)), 0)
  WHERE firm_id = (SELECT p.firm_id FROM decks d JOIN projects p ON p.id = d.project_id WHERE d.id = NEW.deck_id);
END;
--> statement-breakpoint
CREATE TRIGGER analysis_results_count_storage AFTER INSERT ON analysis_results
BEGIN
  UPDATE firm_storage SET bytes = bytes + length(CAST(NEW.data_json AS BLOB)) + COALESCE(length(NEW.data_blob), 0)
  WHERE firm_id = (SELECT p.firm_id FROM deck_versions v JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id WHERE v.id = NEW.version_id);
END;
