ALTER TABLE `study` ADD `planned_agitation_rpm` real;--> statement-breakpoint
ALTER TABLE `study` ADD `planned_gas_flow_l_per_min` real;