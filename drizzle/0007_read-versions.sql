CREATE TABLE `read_versions` (
	`scope` text PRIMARY KEY NOT NULL,
	`version` integer DEFAULT 0 NOT NULL
);
