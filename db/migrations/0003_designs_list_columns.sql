ALTER TABLE `designs` ADD `latest_revision` integer;--> statement-breakpoint
ALTER TABLE `designs` ADD `signoff_state` text;--> statement-breakpoint
CREATE INDEX `designs_team_updated` ON `designs` (`team_id`,`updated_at`);--> statement-breakpoint
CREATE INDEX `designs_team_name` ON `designs` (`team_id`,"name" COLLATE NOCASE);--> statement-breakpoint
CREATE INDEX `designs_team_topology` ON `designs` (`team_id`,`topology`);--> statement-breakpoint
CREATE INDEX `designs_team_latest_revision` ON `designs` (`team_id`,`latest_revision`);--> statement-breakpoint
CREATE INDEX `designs_team_signoff` ON `designs` (`team_id`,`signoff_state`);