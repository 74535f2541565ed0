CREATE TABLE `zones` (
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
	`history` json,
	CONSTRAINT `zones_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `brews` ADD `history` json;--> statement-breakpoint
ALTER TABLE `calibrations` ADD `history` json;--> statement-breakpoint
ALTER TABLE `entries` ADD `history` json;--> statement-breakpoint
ALTER TABLE `events` ADD `history` json;--> statement-breakpoint
ALTER TABLE `instruments` ADD `history` json;--> statement-breakpoint
ALTER TABLE `lots` ADD `history` json;--> statement-breakpoint
ALTER TABLE `readings` ADD `history` json;--> statement-breakpoint
ALTER TABLE `recipes` ADD `history` json;--> statement-breakpoint
ALTER TABLE `rounds` ADD `history` json;--> statement-breakpoint
ALTER TABLE `trips` ADD `history` json;--> statement-breakpoint
ALTER TABLE `zones` ADD CONSTRAINT `zones_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `zones_team_rev_idx` ON `zones` (`team_id`,`rev`);