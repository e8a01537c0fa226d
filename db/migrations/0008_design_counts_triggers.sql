-- design_counts holds each team's number of designs per list bucket (archived, topology, state),
-- so the designs list's total is a sum over a few rows whatever the team's size. A design's state
-- is 'unsaved' before its first revision, else its mirrored sign-off state.
CREATE TRIGGER `design_counts_insert` AFTER INSERT ON `designs`
BEGIN
  INSERT OR IGNORE INTO `design_counts` (`team_id`, `archived`, `topology`, `state`, `n`)
    VALUES (NEW.`team_id`, NEW.`archived_at` IS NOT NULL, NEW.`topology`,
            CASE WHEN NEW.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(NEW.`signoff_state`, '') END, 0);
  UPDATE `design_counts` SET `n` = `n` + 1
   WHERE `team_id` = NEW.`team_id` AND `archived` = (NEW.`archived_at` IS NOT NULL) AND `topology` = NEW.`topology`
     AND `state` = CASE WHEN NEW.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(NEW.`signoff_state`, '') END;
END;
--> statement-breakpoint
CREATE TRIGGER `design_counts_delete` AFTER DELETE ON `designs`
BEGIN
  UPDATE `design_counts` SET `n` = `n` - 1
   WHERE `team_id` = OLD.`team_id` AND `archived` = (OLD.`archived_at` IS NOT NULL) AND `topology` = OLD.`topology`
     AND `state` = CASE WHEN OLD.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(OLD.`signoff_state`, '') END;
END;
--> statement-breakpoint
CREATE TRIGGER `design_counts_update` AFTER UPDATE OF `team_id`, `archived_at`, `topology`, `latest_revision`, `signoff_state` ON `designs`
WHEN OLD.`team_id` IS NOT NEW.`team_id` OR (OLD.`archived_at` IS NULL) IS NOT (NEW.`archived_at` IS NULL)
  OR OLD.`topology` IS NOT NEW.`topology` OR OLD.`latest_revision` IS NOT NEW.`latest_revision` OR OLD.`signoff_state` IS NOT NEW.`signoff_state`
BEGIN
  UPDATE `design_counts` SET `n` = `n` - 1
   WHERE `team_id` = OLD.`team_id` AND `archived` = (OLD.`archived_at` IS NOT NULL) AND `topology` = OLD.`topology`
     AND `state` = CASE WHEN OLD.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(OLD.`signoff_state`, '') END;
  INSERT OR IGNORE INTO `design_counts` (`team_id`, `archived`, `topology`, `state`, `n`)
    VALUES (NEW.`team_id`, NEW.`archived_at` IS NOT NULL, NEW.`topology`,
            CASE WHEN NEW.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(NEW.`signoff_state`, '') END, 0);
  UPDATE `design_counts` SET `n` = `n` + 1
   WHERE `team_id` = NEW.`team_id` AND `archived` = (NEW.`archived_at` IS NOT NULL) AND `topology` = NEW.`topology`
     AND `state` = CASE WHEN NEW.`latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(NEW.`signoff_state`, '') END;
END;
--> statement-breakpoint
INSERT INTO `design_counts` (`team_id`, `archived`, `topology`, `state`, `n`)
  SELECT `team_id`, `archived_at` IS NOT NULL, `topology`,
         CASE WHEN `latest_revision` IS NULL THEN 'unsaved' ELSE COALESCE(`signoff_state`, '') END, count(*)
    FROM `designs` GROUP BY 1, 2, 3, 4;
