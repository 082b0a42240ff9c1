CREATE TABLE `password_resets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`token_hash` text NOT NULL,
	`created_at` text NOT NULL,
	`expires_at` text NOT NULL,
	`used_at` text,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `password_resets_token_hash_unique` ON `password_resets` (`token_hash`);--> statement-breakpoint
CREATE INDEX `password_resets_user_idx` ON `password_resets` (`user_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`email` text NOT NULL,
	`role` text NOT NULL,
	`token_hash` text NOT NULL,
	`invited_by_user_id` integer NOT NULL,
	`created_at` text NOT NULL,
	`expires_at` text NOT NULL,
	`accepted_at` text,
	`accepted_by_user_id` integer,
	`revoked_at` text,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`invited_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`accepted_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invitations_token_hash_unique` ON `invitations` (`token_hash`);--> statement-breakpoint
CREATE INDEX `invitations_organization_idx` ON `invitations` (`organization_id`,`email`);--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`role` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_organization_user_idx` ON `memberships` (`organization_id`,`user_id`);--> statement-breakpoint
CREATE INDEX `memberships_user_idx` ON `memberships` (`user_id`);--> statement-breakpoint
CREATE TABLE `organizations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`slug` text NOT NULL,
	`settings` text DEFAULT '{}' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `organizations_slug_unique` ON `organizations` (`slug`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`sid` text PRIMARY KEY NOT NULL,
	`sess` text NOT NULL,
	`expire` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `sites` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`description` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sites_organization_name_idx` ON `sites` (`organization_id`,`name`);--> statement-breakpoint
CREATE UNIQUE INDEX `sites_id_organization_idx` ON `sites` (`id`,`organization_id`);--> statement-breakpoint
CREATE TABLE `agents` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`cas_number` text,
	`molecular_weight` real,
	`notes` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "agents_molecular_weight_positive" CHECK("agents"."molecular_weight" IS NULL OR "agents"."molecular_weight" > 0),
	CONSTRAINT "agents_noise_has_no_chemistry" CHECK("agents"."kind" = 'chemical' OR ("agents"."cas_number" IS NULL AND "agents"."molecular_weight" IS NULL))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `agents_organization_name_idx` ON `agents` (`organization_id`,`name`);--> statement-breakpoint
CREATE UNIQUE INDEX `agents_id_organization_idx` ON `agents` (`id`,`organization_id`);--> statement-breakpoint
CREATE TABLE `oel_entries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`agent_id` integer NOT NULL,
	`source` text NOT NULL,
	`value` real NOT NULL,
	`unit` text NOT NULL,
	`averaging_time` text NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`agent_id`,`organization_id`) REFERENCES `agents`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "oel_entries_value_positive" CHECK("oel_entries"."value" > 0)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `oel_entries_id_organization_idx` ON `oel_entries` (`id`,`organization_id`);--> statement-breakpoint
CREATE TABLE `exposure_groups` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`site_id` integer NOT NULL,
	`name` text NOT NULL,
	`process_area` text DEFAULT '' NOT NULL,
	`job_titles` text DEFAULT '[]' NOT NULL,
	`tasks` text DEFAULT '' NOT NULL,
	`agent_id` integer NOT NULL,
	`oel_entry_id` integer,
	`oel_value` real NOT NULL,
	`oel_unit` text NOT NULL,
	`oel_source` text NOT NULL,
	`oel_averaging_time` text NOT NULL,
	`action_level` real,
	`shift_hours` real DEFAULT 8 NOT NULL,
	`noise_criteria_set` text,
	`exposure_profile` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`site_id`,`organization_id`) REFERENCES `sites`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`agent_id`,`organization_id`) REFERENCES `agents`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`oel_entry_id`,`organization_id`) REFERENCES `oel_entries`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "exposure_groups_oel_positive" CHECK("exposure_groups"."oel_value" > 0),
	CONSTRAINT "exposure_groups_action_level_positive" CHECK("exposure_groups"."action_level" IS NULL OR "exposure_groups"."action_level" > 0),
	CONSTRAINT "exposure_groups_shift_hours_range" CHECK("exposure_groups"."shift_hours" > 0 AND "exposure_groups"."shift_hours" <= 24)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `exposure_groups_site_name_idx` ON `exposure_groups` (`site_id`,`name`);--> statement-breakpoint
CREATE UNIQUE INDEX `exposure_groups_id_organization_idx` ON `exposure_groups` (`id`,`organization_id`);--> statement-breakpoint
CREATE INDEX `exposure_groups_organization_idx` ON `exposure_groups` (`organization_id`);--> statement-breakpoint
CREATE TABLE `group_memberships` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`worker_id` integer NOT NULL,
	`exposure_group_id` integer NOT NULL,
	`from_date` text NOT NULL,
	`to_date` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`worker_id`,`organization_id`) REFERENCES `workers`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`exposure_group_id`,`organization_id`) REFERENCES `exposure_groups`(`id`,`organization_id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "group_memberships_dates_ordered" CHECK("group_memberships"."to_date" IS NULL OR "group_memberships"."to_date" >= "group_memberships"."from_date")
);
--> statement-breakpoint
CREATE INDEX `group_memberships_group_idx` ON `group_memberships` (`exposure_group_id`,`from_date`);--> statement-breakpoint
CREATE INDEX `group_memberships_worker_idx` ON `group_memberships` (`worker_id`);--> statement-breakpoint
CREATE TABLE `workers` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`code` text NOT NULL,
	`name` text,
	`job_title` text DEFAULT '' NOT NULL,
	`archived` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `workers_organization_code_idx` ON `workers` (`organization_id`,`code`);--> statement-breakpoint
CREATE UNIQUE INDEX `workers_id_organization_idx` ON `workers` (`id`,`organization_id`);--> statement-breakpoint
CREATE TABLE `audit_events` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer,
	`actor_user_id` integer,
	`entity_type` text NOT NULL,
	`entity_id` text NOT NULL,
	`action` text NOT NULL,
	`reason` text,
	`before` text,
	`after` text,
	`at` text NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`actor_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_events_organization_at_idx` ON `audit_events` (`organization_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_events_entity_idx` ON `audit_events` (`entity_type`,`entity_id`);