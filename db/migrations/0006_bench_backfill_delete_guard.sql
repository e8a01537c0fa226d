-- Bench data uploaded before it belonged to a revision goes to the design's latest revision at
-- the time of this migration (the model it was most likely compared with). Data of a design
-- without any revision stays design-level (revision_id NULL) and is shown as such.
UPDATE `bench_data` SET `revision_id` = (
  SELECT r.id FROM `revisions` r WHERE r.design_id = `bench_data`.design_id ORDER BY r.number DESC LIMIT 1
) WHERE `revision_id` IS NULL;
--> statement-breakpoint
-- Signed-off work is a record: a design with an approved revision can be archived, never deleted.
CREATE TRIGGER `designs_no_delete_signed_off` BEFORE DELETE ON `designs`
WHEN EXISTS (
  SELECT 1 FROM `signoff_events` e JOIN `revisions` r ON r.id = e.revision_id
   WHERE r.design_id = OLD.id AND e.state = 'approved'
)
BEGIN
  SELECT RAISE(ABORT, 'a design with an approved revision cannot be deleted: archive it instead');
END;
