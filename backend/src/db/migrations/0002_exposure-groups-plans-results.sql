CREATE TABLE `planned_picks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`sampling_plan_id` integer NOT NULL,
	`draw` integer NOT NULL,
	`worker_id` integer NOT NULL,
	`date` text NOT NULL,
	`position` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sampling_plan_id`,`organization_id`) REFERENCES `sampling_plans`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`,`organization_id`) REFERENCES `workers`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `planned_picks_plan_draw_worker_date_idx` ON `planned_picks` (`sampling_plan_id`,`draw`,`worker_id`,`date`);--> statement-breakpoint
CREATE TABLE `sampling_plans` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`title` text DEFAULT '' NOT NULL,
	`target_count` integer DEFAULT 6 NOT NULL,
	`start_date` text NOT NULL,
	`end_date` text NOT NULL,
	`include_weekends` integer DEFAULT false NOT NULL,
	`seed` integer NOT NULL,
	`draw` integer DEFAULT 1 NOT NULL,
	`available_shifts` integer DEFAULT 0 NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_by_user_id` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "sampling_plans_target_count_range" CHECK("sampling_plans"."target_count" >= 1 AND "sampling_plans"."target_count" <= 200),
	CONSTRAINT "sampling_plans_dates_ordered" CHECK("sampling_plans"."end_date" >= "sampling_plans"."start_date"),
	CONSTRAINT "sampling_plans_seed_range" CHECK("sampling_plans"."seed" >= 1 AND "sampling_plans"."seed" <= 4294967295)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sampling_plans_id_organization_idx` ON `sampling_plans` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `sampling_plans_group_idx` ON `sampling_plans` (`exposure_group_id`);--> statement-breakpoint
CREATE TABLE `import_batches` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`file_name` text NOT NULL,
	`file_size` integer NOT NULL,
	`sha256` text NOT NULL,
	`content` text NOT NULL,
	`delimiter` text NOT NULL,
	`row_count` integer NOT NULL,
	`status` text DEFAULT 'uploaded' NOT NULL,
	`mapping` text,
	`result_count` integer DEFAULT 0 NOT NULL,
	`uploaded_by_user_id` integer,
	`committed_by_user_id` integer,
	`committed_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`committed_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `import_batches_id_organization_idx` ON `import_batches` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `import_batches_organization_idx` ON `import_batches` (`organization_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `shift_results` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`worker_id` integer NOT NULL,
	`agent_id` integer NOT NULL,
	`date` text NOT NULL,
	`value` real NOT NULL,
	`unit` text NOT NULL,
	`non_detect` integer DEFAULT false NOT NULL,
	`detection_limit` real,
	`source` text NOT NULL,
	`sample_id` text,
	`lab` text,
	`start_time` text,
	`end_time` text,
	`sampled_minutes` real,
	`reported_value` real,
	`reported_unit` text,
	`details` text,
	`import_batch_id` integer,
	`notes` text DEFAULT '' NOT NULL,
	`status` text DEFAULT 'valid' NOT NULL,
	`void_reason` text,
	`voided_by_user_id` integer,
	`voided_at` text,
	`created_by_user_id` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`voided_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`,`organization_id`) REFERENCES `workers`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`agent_id`,`organization_id`) REFERENCES `agents`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`import_batch_id`,`organization_id`) REFERENCES `import_batches`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "shift_results_value_positive" CHECK("shift_results"."value" > 0),
	CONSTRAINT "shift_results_non_detect_has_limit" CHECK("shift_results"."non_detect" = 0 OR ("shift_results"."detection_limit" IS NOT NULL AND "shift_results"."detection_limit" > 0 AND "shift_results"."value" = "shift_results"."detection_limit")),
	CONSTRAINT "shift_results_void_has_reason" CHECK("shift_results"."status" = 'valid' OR ("shift_results"."void_reason" IS NOT NULL AND "shift_results"."voided_at" IS NOT NULL))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `shift_results_id_organization_idx` ON `shift_results` (`id`,`organization_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `shift_results_one_valid_per_shift_idx` ON `shift_results` (`exposure_group_id`,`worker_id`,`agent_id`,`date`) WHERE "shift_results"."status" = 'valid';--> statement-breakpoint
CREATE INDEX `shift_results_group_date_idx` ON `shift_results` (`exposure_group_id`,`date`);--> statement-breakpoint
CREATE INDEX `shift_results_worker_idx` ON `shift_results` (`worker_id`,`date`);--> statement-breakpoint
CREATE INDEX `shift_results_batch_idx` ON `shift_results` (`import_batch_id`);--> statement-breakpoint
ALTER TABLE `oel_entries` ADD `archived` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `exposure_groups` ADD `extended_shift_adjustment` text DEFAULT 'none' NOT NULL;--> statement-breakpoint
ALTER TABLE `exposure_groups` ADD `data_version` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `exposure_groups` ADD `results_changed_at` text;