-- A saved revision is a record of what was reviewed and handed off: never rewritten.
CREATE TRIGGER `revisions_no_update` BEFORE UPDATE ON `revisions`
BEGIN
  SELECT RAISE(ABORT, 'revisions are immutable: save a new revision instead');
END;
--> statement-breakpoint
-- The audit log only grows.
CREATE TRIGGER `audit_log_no_update` BEFORE UPDATE ON `audit_log`
BEGIN
  SELECT RAISE(ABORT, 'the audit log is append-only');
END;
