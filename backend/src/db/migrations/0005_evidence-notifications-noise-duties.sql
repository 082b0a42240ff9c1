CREATE TABLE `notification_preferences` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`organization_id` integer NOT NULL,
	`type` text NOT NULL,
	`enabled` integer NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notification_preferences_user_organization_type_idx` ON `notification_preferences` (`user_id`,`organization_id`,`type`);--> statement-breakpoint
CREATE TABLE `notifications` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`type` text NOT NULL,
	`recipient_user_id` integer NOT NULL,
	`recipient_email` text NOT NULL,
	`subject` text NOT NULL,
	`entity_type` text NOT NULL,
	`entity_id` text NOT NULL,
	`dedupe_key` text NOT NULL,
	`created_at` text NOT NULL,
	`sent_at` text,
	`error` text,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipient_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notifications_dedupe_key_unique` ON `notifications` (`dedupe_key`);--> statement-breakpoint
CREATE INDEX `notifications_organization_created_idx` ON `notifications` (`organization_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `worker_letter_results` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`letter_id` integer NOT NULL,
	`shift_result_id` integer NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`letter_id`,`organization_id`) REFERENCES `worker_letters`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`shift_result_id`,`organization_id`) REFERENCES `shift_results`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `worker_letter_results_letter_idx` ON `worker_letter_results` (`letter_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `worker_letter_results_one_live_letter_idx` ON `worker_letter_results` (`shift_result_id`) WHERE "worker_letter_results"."active" = 1;--> statement-breakpoint
CREATE TABLE `worker_letters` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`worker_id` integer NOT NULL,
	`status` text DEFAULT 'drafted' NOT NULL,
	`duty_cited` text NOT NULL,
	`content` text NOT NULL,
	`drafted_at` text NOT NULL,
	`drafted_by_user_id` integer NOT NULL,
	`delivery` text,
	`recipient_address` text,
	`sent_at` text,
	`sent_by_user_id` integer,
	`handed_over_on` text,
	`sent_pdf` blob,
	`pdf_sha256` text,
	`cancelled_at` text,
	`cancelled_by_user_id` integer,
	`cancel_reason` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`drafted_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sent_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`cancelled_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`,`organization_id`) REFERENCES `workers`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "worker_letters_sent_is_complete" CHECK("worker_letters"."status" <> 'sent' OR ("worker_letters"."sent_at" IS NOT NULL AND "worker_letters"."delivery" IS NOT NULL AND "worker_letters"."pdf_sha256" IS NOT NULL AND "worker_letters"."sent_pdf" IS NOT NULL)),
	CONSTRAINT "worker_letters_email_has_address" CHECK("worker_letters"."delivery" IS NULL OR "worker_letters"."delivery" <> 'email' OR "worker_letters"."recipient_address" IS NOT NULL),
	CONSTRAINT "worker_letters_hand_has_date" CHECK("worker_letters"."delivery" IS NULL OR "worker_letters"."delivery" <> 'hand' OR "worker_letters"."handed_over_on" IS NOT NULL),
	CONSTRAINT "worker_letters_cancel_has_reason" CHECK("worker_letters"."status" <> 'cancelled' OR ("worker_letters"."cancel_reason" IS NOT NULL AND "worker_letters"."cancelled_at" IS NOT NULL))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `worker_letters_id_organization_idx` ON `worker_letters` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `worker_letters_group_idx` ON `worker_letters` (`exposure_group_id`,`status`);--> statement-breakpoint
CREATE INDEX `worker_letters_worker_idx` ON `worker_letters` (`worker_id`);--> statement-breakpoint
CREATE TABLE `group_hearing_protectors` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`protector_id` integer NOT NULL,
	`added_by_user_id` integer,
	`created_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`added_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`protector_id`,`organization_id`) REFERENCES `hearing_protectors`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `group_hearing_protectors_pair_idx` ON `group_hearing_protectors` (`exposure_group_id`,`protector_id`);--> statement-breakpoint
CREATE INDEX `group_hearing_protectors_protector_idx` ON `group_hearing_protectors` (`protector_id`);--> statement-breakpoint
CREATE TABLE `hearing_protectors` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`type` text NOT NULL,
	`nrr` real,
	`snr` real,
	`h` real,
	`m` real,
	`l` real,
	`notes` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "hearing_protectors_nrr_range" CHECK("hearing_protectors"."nrr" IS NULL OR ("hearing_protectors"."nrr" >= 0 AND "hearing_protectors"."nrr" <= 45)),
	CONSTRAINT "hearing_protectors_octave_range" CHECK(("hearing_protectors"."snr" IS NULL OR ("hearing_protectors"."snr" >= 0 AND "hearing_protectors"."snr" <= 50)) AND ("hearing_protectors"."h" IS NULL OR ("hearing_protectors"."h" >= 0 AND "hearing_protectors"."h" <= 50)) AND ("hearing_protectors"."m" IS NULL OR ("hearing_protectors"."m" >= 0 AND "hearing_protectors"."m" <= 50)) AND ("hearing_protectors"."l" IS NULL OR ("hearing_protectors"."l" >= 0 AND "hearing_protectors"."l" <= 50)))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `hearing_protectors_organization_name_idx` ON `hearing_protectors` (`organization_id`,`name`);--> statement-breakpoint
CREATE UNIQUE INDEX `hearing_protectors_id_organization_idx` ON `hearing_protectors` (`id`,`organization_id`);--> statement-breakpoint
CREATE TABLE `mixture_components` (
	`organization_id` integer NOT NULL,
	`mixture_agent_id` integer NOT NULL,
	`component_agent_id` integer NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`mixture_agent_id`,`organization_id`) REFERENCES `agents`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`component_agent_id`,`organization_id`) REFERENCES `agents`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `mixture_components_pair_idx` ON `mixture_components` (`mixture_agent_id`,`component_agent_id`);--> statement-breakpoint
CREATE INDEX `mixture_components_component_idx` ON `mixture_components` (`component_agent_id`);--> statement-breakpoint
CREATE TABLE `noise_estimate_measurements` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`estimate_id` integer NOT NULL,
	`task_id` integer,
	`position` integer NOT NULL,
	`laeq_db` real NOT NULL,
	`duration_minutes` real,
	`measured_on` text,
	`worker_id` integer,
	FOREIGN KEY (`estimate_id`) REFERENCES `noise_estimates`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`task_id`) REFERENCES `noise_estimate_tasks`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`) REFERENCES `workers`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "noise_estimate_measurements_duration_positive" CHECK("noise_estimate_measurements"."duration_minutes" IS NULL OR "noise_estimate_measurements"."duration_minutes" > 0)
);
--> statement-breakpoint
CREATE INDEX `noise_estimate_measurements_estimate_idx` ON `noise_estimate_measurements` (`estimate_id`);--> statement-breakpoint
CREATE TABLE `noise_estimate_tasks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`estimate_id` integer NOT NULL,
	`position` integer NOT NULL,
	`name` text NOT NULL,
	`hours` real NOT NULL,
	`duration_uncertainty_hours` real,
	FOREIGN KEY (`estimate_id`) REFERENCES `noise_estimates`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "noise_estimate_tasks_hours_positive" CHECK("noise_estimate_tasks"."hours" > 0)
);
--> statement-breakpoint
CREATE INDEX `noise_estimate_tasks_estimate_idx` ON `noise_estimate_tasks` (`estimate_id`);--> statement-breakpoint
CREATE TABLE `noise_estimates` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`title` text DEFAULT '' NOT NULL,
	`strategy` text NOT NULL,
	`effective_hours` real,
	`instrument` text NOT NULL,
	`group_size` integer,
	`notes` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_by_user_id` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "noise_estimates_hours_range" CHECK("noise_estimates"."effective_hours" IS NULL OR ("noise_estimates"."effective_hours" > 0 AND "noise_estimates"."effective_hours" <= 24)),
	CONSTRAINT "noise_estimates_group_size_positive" CHECK("noise_estimates"."group_size" IS NULL OR "noise_estimates"."group_size" >= 1)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `noise_estimates_id_organization_idx` ON `noise_estimates` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `noise_estimates_group_idx` ON `noise_estimates` (`exposure_group_id`);--> statement-breakpoint
ALTER TABLE `workers` ADD `email` text;--> statement-breakpoint
CREATE INDEX `decision_records_organization_updated_idx` ON `decision_records` (`organization_id`,`updated_at`,`id`);