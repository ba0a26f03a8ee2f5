-- A decided review round (approved, sent back or withdrawn) is locked; rounds are never deleted.
CREATE TRIGGER review_rounds_locked_when_decided BEFORE UPDATE ON review_rounds
WHEN OLD.state <> 'awaiting-review'
BEGIN SELECT RAISE(ABORT, 'a decided review round is locked'); END;
--> statement-breakpoint
CREATE TRIGGER review_rounds_no_delete BEFORE DELETE ON review_rounds
BEGIN SELECT RAISE(ABORT, 'review rounds are kept for the record'); END;
--> statement-breakpoint
-- Review comments are append-only, and an approved round takes no more comments.
CREATE TRIGGER review_comments_no_update BEFORE UPDATE ON review_comments
BEGIN SELECT RAISE(ABORT, 'review comments cannot be edited'); END;
--> statement-breakpoint
CREATE TRIGGER review_comments_no_delete BEFORE DELETE ON review_comments
BEGIN SELECT RAISE(ABORT, 'review comments cannot be deleted'); END;
--> statement-breakpoint
CREATE TRIGGER review_comments_not_on_approved BEFORE INSERT ON review_comments
WHEN (SELECT state FROM review_rounds WHERE id = NEW.round_id) = 'approved'
BEGIN SELECT RAISE(ABORT, 'an approved review round is locked'); END;
--> statement-breakpoint
-- Graded submissions and received messages are kept as they were.
CREATE TRIGGER submissions_no_update BEFORE UPDATE ON submissions
BEGIN SELECT RAISE(ABORT, 'submissions cannot be changed'); END;
--> statement-breakpoint
CREATE TRIGGER submissions_no_delete BEFORE DELETE ON submissions
BEGIN SELECT RAISE(ABORT, 'submissions cannot be deleted'); END;
--> statement-breakpoint
CREATE TRIGGER outbox_messages_no_update BEFORE UPDATE ON outbox_messages
BEGIN SELECT RAISE(ABORT, 'outbox messages cannot be changed'); END;
