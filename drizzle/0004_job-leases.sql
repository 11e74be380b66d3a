ALTER TABLE `jobs` ADD `lease_owner` text;--> statement-breakpoint
ALTER TABLE `jobs` ADD `lease_expires_at` integer;--> statement-breakpoint
ALTER TABLE `jobs` ADD `lane` text DEFAULT 'large' NOT NULL;--> statement-breakpoint
CREATE INDEX `models_workspace_name_idx` ON `models` (`workspace_id`,`name`,`id`);