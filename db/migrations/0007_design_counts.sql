CREATE TABLE `design_counts` (
	`team_id` integer NOT NULL,
	`archived` integer NOT NULL,
	`topology` text NOT NULL,
	`state` text NOT NULL,
	`n` integer DEFAULT 0 NOT NULL,
	PRIMARY KEY(`team_id`, `archived`, `topology`, `state`),
	FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON UPDATE no action ON DELETE cascade
);
