-- Every record moves into one table, with its full history copied into record_history (the record
-- itself keeps the latest 20, as the server does) and each team's counter made for teams that have
-- none yet, never behind the revs its records hold. Nothing is dropped before it is copied.
CREATE TABLE `record_history` (
	`record_id` char(36) NOT NULL,
	`rev` bigint unsigned NOT NULL,
	`entry` json NOT NULL,
	CONSTRAINT `record_history_record_id_rev_pk` PRIMARY KEY(`record_id`,`rev`)
);
--> statement-breakpoint
CREATE TABLE `records` (
	`id` char(36) NOT NULL,
	`entity` varchar(24) NOT NULL,
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
	`history_count` int unsigned NOT NULL DEFAULT 0,
	`parent_id` char(36),
	CONSTRAINT `records_id` PRIMARY KEY(`id`),
	CONSTRAINT `records_team_rev_unique` UNIQUE(`team_id`,`rev`)
);
--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'instrument', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), NULL FROM `instruments`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'calibration', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `instrument_id` FROM `calibrations`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'brew', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `context_ref_id` FROM `brews`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'reading', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `brew_id` FROM `readings`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'event', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), NULL FROM `events`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'round', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, IF(`signed_off_at` IS NULL, `derived`, JSON_OBJECT('signedOffAt', CONCAT(DATE_FORMAT(`signed_off_at`, '%Y-%m-%dT%H:%i:%s.'), LPAD(FLOOR(MICROSECOND(`signed_off_at`) / 1000), 3, '0'), 'Z'), 'signedOffBy', `signed_off_by`)), `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `event_id` FROM `rounds`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'entry', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `round_id` FROM `entries`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'trip', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), NULL FROM `trips`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'lot', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), `trip_id` FROM `lots`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'recipe', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), NULL FROM `recipes`;--> statement-breakpoint
INSERT INTO `records` (`id`, `entity`, `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, `history_count`, `parent_id`) SELECT `id`, 'zone', `team_id`, `created_by`, `created_at`, `updated_at`, `rev`, `deleted_at`, `data`, `derived`, `field_revs`, `history`, COALESCE(JSON_LENGTH(`history`), 0), NULL FROM `zones`;--> statement-breakpoint
INSERT INTO `record_history` (`record_id`, `rev`, `entry`) SELECT r.`id`, h.`rev`, h.`entry` FROM `records` r, JSON_TABLE(r.`history`, '$[*]' COLUMNS (`rev` bigint PATH '$.rev', `entry` json PATH '$')) AS h WHERE r.`history` IS NOT NULL;--> statement-breakpoint
UPDATE `records` SET `history` = JSON_EXTRACT(`history`, CONCAT('$[', `history_count` - 20, ' to ', `history_count` - 1, ']')) WHERE `history_count` > 20;--> statement-breakpoint
INSERT IGNORE INTO `team_sync_state` (`team_id`, `last_rev`) SELECT `id`, 0 FROM `teams`;--> statement-breakpoint
UPDATE `team_sync_state` s SET `last_rev` = GREATEST(s.`last_rev`, (SELECT COALESCE(MAX(r.`rev`), 0) FROM `records` r WHERE r.`team_id` = s.`team_id`));--> statement-breakpoint
DROP TABLE `brews`;--> statement-breakpoint
DROP TABLE `calibrations`;--> statement-breakpoint
DROP TABLE `entries`;--> statement-breakpoint
DROP TABLE `events`;--> statement-breakpoint
DROP TABLE `instruments`;--> statement-breakpoint
DROP TABLE `lots`;--> statement-breakpoint
DROP TABLE `readings`;--> statement-breakpoint
DROP TABLE `recipes`;--> statement-breakpoint
DROP TABLE `rounds`;--> statement-breakpoint
DROP TABLE `trips`;--> statement-breakpoint
DROP TABLE `zones`;--> statement-breakpoint
ALTER TABLE `sync_mutations` DROP PRIMARY KEY;--> statement-breakpoint
ALTER TABLE `sync_mutations` ADD PRIMARY KEY(`user_id`,`client_id`,`mutation_id`);--> statement-breakpoint
ALTER TABLE `record_history` ADD CONSTRAINT `record_history_record_id_records_id_fk` FOREIGN KEY (`record_id`) REFERENCES `records`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `records` ADD CONSTRAINT `records_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `records_parent_idx` ON `records` (`parent_id`,`entity`);--> statement-breakpoint
CREATE INDEX `records_team_entity_idx` ON `records` (`team_id`,`entity`);