-- teams.list_version changes whenever anything the designs list shows may have changed: a design
-- row (insert, delete, any update: name, state, latest revision, archive), an owner's name, or a
-- sign-off event (which decides whom a design waits for). The list API keys its cached pages by it.
CREATE TRIGGER `team_list_version_design_insert` AFTER INSERT ON `designs`
BEGIN
  UPDATE `teams` SET `list_version` = `list_version` + 1 WHERE `id` = NEW.`team_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `team_list_version_design_delete` AFTER DELETE ON `designs`
BEGIN
  UPDATE `teams` SET `list_version` = `list_version` + 1 WHERE `id` = OLD.`team_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `team_list_version_design_update` AFTER UPDATE ON `designs`
BEGIN
  UPDATE `teams` SET `list_version` = `list_version` + 1 WHERE `id` IN (OLD.`team_id`, NEW.`team_id`);
END;
--> statement-breakpoint
CREATE TRIGGER `team_list_version_user_name` AFTER UPDATE OF `name` ON `users`
WHEN OLD.`name` IS NOT NEW.`name`
BEGIN
  UPDATE `teams` SET `list_version` = `list_version` + 1
   WHERE `id` IN (SELECT `team_id` FROM `designs` WHERE `owner_id` = NEW.`id`);
END;
--> statement-breakpoint
CREATE TRIGGER `team_list_version_signoff_event` AFTER INSERT ON `signoff_events`
BEGIN
  UPDATE `teams` SET `list_version` = `list_version` + 1
   WHERE `id` = (SELECT d.`team_id` FROM `revisions` r JOIN `designs` d ON d.`id` = r.`design_id` WHERE r.`id` = NEW.`revision_id`);
END;
