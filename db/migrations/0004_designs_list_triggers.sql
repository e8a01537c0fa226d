-- designs.latest_revision and designs.signoff_state mirror the latest revision and its latest
-- sign-off event, so the designs list filters and sorts on indexes instead of sub-queries.
CREATE TRIGGER `designs_latest_revision` AFTER INSERT ON `revisions`
BEGIN
  UPDATE `designs` SET `latest_revision` = NEW.`number`, `signoff_state` = 'draft'
   WHERE `id` = NEW.`design_id` AND (`latest_revision` IS NULL OR `latest_revision` < NEW.`number`);
END;
--> statement-breakpoint
CREATE TRIGGER `designs_signoff_state` AFTER INSERT ON `signoff_events`
BEGIN
  UPDATE `designs` SET `signoff_state` = NEW.`state`
   WHERE `id` = (SELECT `design_id` FROM `revisions` WHERE `id` = NEW.`revision_id`)
     AND `latest_revision` = (SELECT `number` FROM `revisions` WHERE `id` = NEW.`revision_id`);
END;
--> statement-breakpoint
UPDATE `designs` SET `latest_revision` = (SELECT MAX(r.`number`) FROM `revisions` r WHERE r.`design_id` = `designs`.`id`);
--> statement-breakpoint
UPDATE `designs` SET `signoff_state` = CASE WHEN `latest_revision` IS NULL THEN NULL ELSE COALESCE(
  (SELECT e.`state` FROM `signoff_events` e JOIN `revisions` r ON r.`id` = e.`revision_id`
    WHERE r.`design_id` = `designs`.`id` AND r.`number` = `designs`.`latest_revision`
    ORDER BY e.`id` DESC LIMIT 1), 'draft') END;
