-- Approved decision records never change (PRODUCT.md capability 6): SQLite itself refuses, whoever asks.
-- The service answers 409 first (services/decision-records.ts); these triggers are the last line.
-- The one change an approved record takes is status approved → superseded (with superseded_at and
-- updated_at) when a newer record for the group is approved. Written by hand (drizzle-kit generate --custom).
CREATE TRIGGER `decision_records_frozen_no_update` BEFORE UPDATE ON `decision_records`
WHEN OLD.`status` IN ('approved', 'superseded') AND (
  OLD.`status` = 'superseded'
  OR NEW.`status` NOT IN ('approved', 'superseded')
  OR NEW.`organization_id` IS NOT OLD.`organization_id`
  OR NEW.`exposure_group_id` IS NOT OLD.`exposure_group_id`
  OR NEW.`category` IS NOT OLD.`category`
  OR NEW.`judgement` IS NOT OLD.`judgement`
  OR NEW.`rationale` IS NOT OLD.`rationale`
  OR NEW.`actions` IS NOT OLD.`actions`
  OR NEW.`review_date` IS NOT OLD.`review_date`
  OR NEW.`review_date_source` IS NOT OLD.`review_date_source`
  OR NEW.`prior` IS NOT OLD.`prior`
  OR NEW.`exclusions` IS NOT OLD.`exclusions`
  OR NEW.`frozen_inputs` IS NOT OLD.`frozen_inputs`
  OR NEW.`data_hash` IS NOT OLD.`data_hash`
  OR NEW.`method` IS NOT OLD.`method`
  OR NEW.`engine_version` IS NOT OLD.`engine_version`
  OR NEW.`settings` IS NOT OLD.`settings`
  OR NEW.`figures` IS NOT OLD.`figures`
  OR NEW.`drafted_by_user_id` IS NOT OLD.`drafted_by_user_id`
  OR NEW.`submitted_at` IS NOT OLD.`submitted_at`
  OR NEW.`approved_by_user_id` IS NOT OLD.`approved_by_user_id`
  OR NEW.`approved_at` IS NOT OLD.`approved_at`
  OR NEW.`data_version_at_draft` IS NOT OLD.`data_version_at_draft`
  OR NEW.`data_version_at_approval` IS NOT OLD.`data_version_at_approval`
  OR NEW.`created_at` IS NOT OLD.`created_at`
)
BEGIN
  SELECT RAISE(ABORT, 'decision_records: an approved decision record cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER `decision_records_no_delete` BEFORE DELETE ON `decision_records`
BEGIN
  SELECT RAISE(ABORT, 'decision_records: a decision record cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER `decision_acknowledgements_no_update` BEFORE UPDATE ON `decision_acknowledgements`
BEGIN
  SELECT RAISE(ABORT, 'decision_acknowledgements: an acknowledgement cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER `decision_acknowledgements_no_delete` BEFORE DELETE ON `decision_acknowledgements`
BEGIN
  SELECT RAISE(ABORT, 'decision_acknowledgements: an acknowledgement cannot be deleted');
END;
