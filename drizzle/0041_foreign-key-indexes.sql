CREATE INDEX "implant_sites_patient_idx" ON "implant_sites" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "placements_patient_idx" ON "placements" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "complications_patient_idx" ON "complications" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "complications_instance_idx" ON "complications" USING btree ("component_instance_id") WHERE "complications"."component_instance_id" is not null;--> statement-breakpoint
CREATE INDEX "component_instances_patient_idx" ON "component_instances" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "component_instances_restoration_idx" ON "component_instances" USING btree ("restoration_id") WHERE "component_instances"."restoration_id" is not null;--> statement-breakpoint
CREATE INDEX "insert_changes_restoration_idx" ON "insert_changes" USING btree ("restoration_id");--> statement-breakpoint
CREATE INDEX "lab_prescriptions_patient_idx" ON "lab_prescriptions" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "restorations_replaced_by_idx" ON "restorations" USING btree ("replaced_by_id") WHERE "restorations"."replaced_by_id" is not null;--> statement-breakpoint
CREATE INDEX "torque_events_patient_idx" ON "torque_events" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "recall_exams_bone_level_measurement_idx" ON "recall_exams" USING btree ("bone_level_measurement_id") WHERE "recall_exams"."bone_level_measurement_id" is not null;--> statement-breakpoint
CREATE INDEX "reminder_log_patient_idx" ON "reminder_log" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "radiograph_measurements_patient_idx" ON "radiograph_measurements" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "seating_checks_patient_idx" ON "seating_checks" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "seating_checks_radiograph_idx" ON "seating_checks" USING btree ("radiograph_id");--> statement-breakpoint
CREATE INDEX "impression_scan_bodies_site_idx" ON "impression_scan_bodies" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "impressions_patient_idx" ON "impressions" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "scan_body_markers_patient_idx" ON "scan_body_markers" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "scan_body_markers_site_idx" ON "scan_body_markers" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "scan_files_patient_idx" ON "scan_files" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "scan_files_impression_idx" ON "scan_files" USING btree ("impression_id");--> statement-breakpoint
CREATE INDEX "referral_summary_mails_share_idx" ON "referral_summary_mails" USING btree ("share_id");--> statement-breakpoint
CREATE INDEX "imported_free_text_parts_patient_idx" ON "imported_free_text_parts" USING btree ("patient_id");