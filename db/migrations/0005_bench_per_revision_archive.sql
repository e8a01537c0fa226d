ALTER TABLE `bench_data` ADD `revision_id` integer REFERENCES revisions(id);--> statement-breakpoint
CREATE INDEX `bench_data_revision` ON `bench_data` (`revision_id`);--> statement-breakpoint
ALTER TABLE `designs` ADD `archived_at` integer;--> statement-breakpoint
ALTER TABLE `designs` ADD `archived_by` integer REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `remarks` ADD `compared_with` integer;