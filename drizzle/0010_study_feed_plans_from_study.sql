-- Each feed now carries its own plan: copy the study's single plan onto each of its feeds before the
-- study-level columns go (next migration).
UPDATE `study_feed` SET
	`strategy` = (SELECT `feed_strategy` FROM `study` WHERE `study`.`id` = `study_feed`.`study_id`),
	`start_h` = (SELECT `feed_start_h` FROM `study` WHERE `study`.`id` = `study_feed`.`study_id`),
	`mu_set_per_h` = (SELECT `feed_mu_set_per_h` FROM `study` WHERE `study`.`id` = `study_feed`.`study_id`);
