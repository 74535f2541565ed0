CREATE TABLE `brews` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`context_ref_id` char(36),
	`calibration_id` char(36),
	CONSTRAINT `brews_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `calibrations` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`instrument_id` char(36),
	CONSTRAINT `calibrations_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `entries` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`round_id` char(36),
	CONSTRAINT `entries_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `events` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	CONSTRAINT `events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `instruments` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	CONSTRAINT `instruments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `lots` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`trip_id` char(36),
	CONSTRAINT `lots_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `readings` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`brew_id` char(36),
	CONSTRAINT `readings_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `recipes` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	CONSTRAINT `recipes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `rounds` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	`event_id` char(36),
	`signed_off_at` datetime(3),
	`signed_off_by` char(36),
	CONSTRAINT `rounds_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `sync_mutations` (
	`client_id` char(36) NOT NULL,
	`mutation_id` char(36) NOT NULL,
	`user_id` char(36) NOT NULL,
	`result` json NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sync_mutations_client_id_mutation_id_pk` PRIMARY KEY(`client_id`,`mutation_id`)
);
--> statement-breakpoint
CREATE TABLE `team_sync_state` (
	`team_id` char(36) NOT NULL,
	`last_rev` bigint unsigned NOT NULL DEFAULT 0,
	CONSTRAINT `team_sync_state_team_id` PRIMARY KEY(`team_id`)
);
--> statement-breakpoint
CREATE TABLE `trips` (
	`id` char(36) NOT NULL,
	`team_id` char(36) NOT NULL,
	`created_by` char(36) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`rev` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`data` json NOT NULL,
	`derived` json,
	`field_revs` json NOT NULL,
	CONSTRAINT `trips_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `brews` ADD CONSTRAINT `brews_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `calibrations` ADD CONSTRAINT `calibrations_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `entries` ADD CONSTRAINT `entries_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `events` ADD CONSTRAINT `events_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `instruments` ADD CONSTRAINT `instruments_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `lots` ADD CONSTRAINT `lots_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `readings` ADD CONSTRAINT `readings_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `recipes` ADD CONSTRAINT `recipes_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rounds` ADD CONSTRAINT `rounds_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `team_sync_state` ADD CONSTRAINT `team_sync_state_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `trips` ADD CONSTRAINT `trips_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `brews_team_rev_idx` ON `brews` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `brews_context_ref_id_idx` ON `brews` (`context_ref_id`);--> statement-breakpoint
CREATE INDEX `brews_calibration_id_idx` ON `brews` (`calibration_id`);--> statement-breakpoint
CREATE INDEX `calibrations_team_rev_idx` ON `calibrations` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `calibrations_instrument_id_idx` ON `calibrations` (`instrument_id`);--> statement-breakpoint
CREATE INDEX `entries_team_rev_idx` ON `entries` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `entries_round_id_idx` ON `entries` (`round_id`);--> statement-breakpoint
CREATE INDEX `events_team_rev_idx` ON `events` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `instruments_team_rev_idx` ON `instruments` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `lots_team_rev_idx` ON `lots` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `lots_trip_id_idx` ON `lots` (`trip_id`);--> statement-breakpoint
CREATE INDEX `readings_team_rev_idx` ON `readings` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `readings_brew_id_idx` ON `readings` (`brew_id`);--> statement-breakpoint
CREATE INDEX `recipes_team_rev_idx` ON `recipes` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `rounds_team_rev_idx` ON `rounds` (`team_id`,`rev`);--> statement-breakpoint
CREATE INDEX `rounds_event_id_idx` ON `rounds` (`event_id`);--> statement-breakpoint
CREATE INDEX `rounds_signed_off_at_idx` ON `rounds` (`signed_off_at`);--> statement-breakpoint
CREATE INDEX `rounds_signed_off_by_idx` ON `rounds` (`signed_off_by`);--> statement-breakpoint
CREATE INDEX `trips_team_rev_idx` ON `trips` (`team_id`,`rev`);