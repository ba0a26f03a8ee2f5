-- The database keeps the workflow's rules itself, so a write around the API (plain SQL) is
-- refused with the rule it breaks.
-- A deck never moves to another project (its versions, reviews and audit belong there).
CREATE TRIGGER decks_stay_in_their_project BEFORE UPDATE OF project_id ON decks
WHEN NEW.project_id IS NOT OLD.project_id
BEGIN SELECT RAISE(ABORT, 'a deck never moves to another project'); END;
--> statement-breakpoint
-- An exercise's question and its frozen answer never change (only the due date, instructions).
CREATE TRIGGER assignments_answer_frozen BEFORE UPDATE ON assignments
WHEN NEW.expected_json IS NOT OLD.expected_json OR NEW.params_json IS NOT OLD.params_json OR NEW.kind IS NOT OLD.kind
  OR NEW.version_id IS NOT OLD.version_id OR NEW.deck_id IS NOT OLD.deck_id OR NEW.tolerance_percent IS NOT OLD.tolerance_percent
  OR NEW.firm_id IS NOT OLD.firm_id
BEGIN SELECT RAISE(ABORT, 'an exercise''s question and frozen answer never change'); END;
--> statement-breakpoint
CREATE TRIGGER assignments_no_delete BEFORE DELETE ON assignments
BEGIN SELECT RAISE(ABORT, 'exercises are kept for the record'); END;
--> statement-breakpoint
-- A review round starts awaiting review ...
CREATE TRIGGER review_rounds_start_awaiting BEFORE INSERT ON review_rounds
WHEN NEW.state <> 'awaiting-review'
BEGIN SELECT RAISE(ABORT, 'a review round starts awaiting review'); END;
--> statement-breakpoint
-- ... on a version that was neither approved (an approved version is locked) nor sent back ...
CREATE TRIGGER review_rounds_not_on_decided_version BEFORE INSERT ON review_rounds
WHEN EXISTS (SELECT 1 FROM review_rounds WHERE version_id = NEW.version_id AND state IN ('approved', 'sent-back'))
BEGIN SELECT RAISE(ABORT, 'an approved or sent-back version takes no new review round: an approved version is locked'); END;
--> statement-breakpoint
-- ... moves only from awaiting review to approved, sent back or withdrawn ...
CREATE TRIGGER review_rounds_allowed_moves BEFORE UPDATE OF state ON review_rounds
WHEN NEW.state IS NOT OLD.state AND NOT (OLD.state = 'awaiting-review' AND NEW.state IN ('approved', 'sent-back', 'withdrawn'))
BEGIN SELECT RAISE(ABORT, 'a review round moves only from awaiting review to approved, sent back or withdrawn'); END;
--> statement-breakpoint
-- ... is decided by its assigned reviewer only, never on their own submission, with the time ...
CREATE TRIGGER review_rounds_decided_by_reviewer BEFORE UPDATE OF state ON review_rounds
WHEN NEW.state IN ('approved', 'sent-back') AND OLD.state = 'awaiting-review'
  AND (NEW.decided_by IS NULL OR NEW.decided_by IS NOT NEW.reviewer_id OR NEW.decided_by = NEW.submitted_by OR NEW.decided_at IS NULL)
BEGIN SELECT RAISE(ABORT, 'only the assigned reviewer decides a review round, never on their own submission, and the time is recorded'); END;
--> statement-breakpoint
-- ... and keeps its version, deck, firm, submitter and reviewer.
CREATE TRIGGER review_rounds_keep_their_parties BEFORE UPDATE ON review_rounds
WHEN NEW.version_id IS NOT OLD.version_id OR NEW.deck_id IS NOT OLD.deck_id OR NEW.project_id IS NOT OLD.project_id
  OR NEW.firm_id IS NOT OLD.firm_id OR NEW.submitted_by IS NOT OLD.submitted_by OR NEW.reviewer_id IS NOT OLD.reviewer_id
BEGIN SELECT RAISE(ABORT, 'a review round keeps its version, submitter and reviewer'); END;
--> statement-breakpoint
-- Refused sign-ins are a record: append-only.
CREATE TRIGGER sign_in_refusals_no_update BEFORE UPDATE ON sign_in_refusals
BEGIN SELECT RAISE(ABORT, 'refused sign-ins are kept as recorded'); END;
--> statement-breakpoint
CREATE TRIGGER sign_in_refusals_no_delete BEFORE DELETE ON sign_in_refusals
BEGIN SELECT RAISE(ABORT, 'refused sign-ins are kept as recorded'); END;
