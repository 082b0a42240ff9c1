CREATE TABLE `noise_log_channels` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`noise_log_id` integer NOT NULL,
	`channel` text NOT NULL,
	`data` blob NOT NULL,
	FOREIGN KEY (`noise_log_id`) REFERENCES `noise_logs`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `noise_log_channels_log_channel_idx` ON `noise_log_channels` (`noise_log_id`,`channel`);--> statement-breakpoint
CREATE TABLE `noise_logs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`worker_id` integer NOT NULL,
	`instrument` text DEFAULT '' NOT NULL,
	`shift_date` text NOT NULL,
	`uploaded_by_user_id` integer,
	`file_name` text NOT NULL,
	`file_size` integer NOT NULL,
	`raw_file` blob NOT NULL,
	`sha256` text NOT NULL,
	`format` text NOT NULL,
	`mapping` text,
	`metadata` text NOT NULL,
	`settings` text NOT NULL,
	`interval_seconds` real NOT NULL,
	`interval_count` integer NOT NULL,
	`run_seconds` real NOT NULL,
	`summary` text NOT NULL,
	`status` text DEFAULT 'uploaded' NOT NULL,
	`shift_result_id` integer,
	`accepted_by_user_id` integer,
	`accepted_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`accepted_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`,`organization_id`) REFERENCES `workers`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`shift_result_id`,`organization_id`) REFERENCES `shift_results`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "noise_logs_interval_range" CHECK("noise_logs"."interval_seconds" >= 0.125 AND "noise_logs"."interval_seconds" <= 60)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `noise_logs_id_organization_idx` ON `noise_logs` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `noise_logs_group_idx` ON `noise_logs` (`exposure_group_id`,`shift_date`);--> statement-breakpoint
CREATE INDEX `noise_logs_worker_idx` ON `noise_logs` (`worker_id`,`shift_date`);--> statement-breakpoint
CREATE TABLE `noise_mapping_presets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`mapping` text NOT NULL,
	`created_by_user_id` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `noise_mapping_presets_name_idx` ON `noise_mapping_presets` (`organization_id`,`name`);--> statement-breakpoint
CREATE TABLE `noise_masks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`noise_log_id` integer NOT NULL,
	`start_s` real NOT NULL,
	`end_s` real NOT NULL,
	`reason` text NOT NULL,
	`origin` text NOT NULL,
	`status` text DEFAULT 'active' NOT NULL,
	`author_user_id` integer,
	`removed_by_user_id` integer,
	`removed_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`author_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`removed_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`noise_log_id`,`organization_id`) REFERENCES `noise_logs`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "noise_masks_span" CHECK("noise_masks"."end_s" > "noise_masks"."start_s")
);
--> statement-breakpoint
CREATE INDEX `noise_masks_log_idx` ON `noise_masks` (`noise_log_id`);--> statement-breakpoint
CREATE TABLE `decision_acknowledgements` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`decision_record_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`decision_record_id`,`organization_id`) REFERENCES `decision_records`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `decision_acknowledgements_record_user_idx` ON `decision_acknowledgements` (`decision_record_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `decision_comments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`decision_record_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`body` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`decision_record_id`,`organization_id`) REFERENCES `decision_records`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `decision_comments_record_idx` ON `decision_comments` (`decision_record_id`);--> statement-breakpoint
CREATE TABLE `decision_records` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`category` integer NOT NULL,
	`judgement` text NOT NULL,
	`rationale` text NOT NULL,
	`actions` text DEFAULT '' NOT NULL,
	`review_date` text NOT NULL,
	`review_date_source` text NOT NULL,
	`prior` text DEFAULT 'reference' NOT NULL,
	`exclusions` text DEFAULT '[]' NOT NULL,
	`frozen_inputs` text,
	`data_hash` text,
	`method` text,
	`engine_version` text,
	`settings` text,
	`figures` text,
	`drafted_by_user_id` integer NOT NULL,
	`submitted_at` text NOT NULL,
	`approved_by_user_id` integer,
	`approved_at` text,
	`returned_by_user_id` integer,
	`returned_at` text,
	`return_comment` text,
	`data_version_at_draft` integer NOT NULL,
	`data_version_at_approval` integer,
	`superseded_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`drafted_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`approved_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`returned_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "decision_records_category_range" CHECK("decision_records"."category" BETWEEN 0 AND 4)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `decision_records_id_organization_idx` ON `decision_records` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `decision_records_group_idx` ON `decision_records` (`exposure_group_id`,`status`);--> statement-breakpoint
CREATE INDEX `decision_records_organization_idx` ON `decision_records` (`organization_id`,`status`);