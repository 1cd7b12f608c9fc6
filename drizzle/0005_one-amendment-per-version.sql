DROP INDEX "recall_exams_supersedes_idx";--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."placements"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."complications"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restorations" ADD CONSTRAINT "restorations_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."torque_events"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exams" ADD CONSTRAINT "recall_exams_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."recall_exams"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "placements_supersedes_unique" ON "placements" USING btree ("supersedes_id");--> statement-breakpoint
CREATE UNIQUE INDEX "complications_supersedes_unique" ON "complications" USING btree ("supersedes_id");--> statement-breakpoint
CREATE UNIQUE INDEX "restorations_supersedes_unique" ON "restorations" USING btree ("supersedes_id");--> statement-breakpoint
CREATE UNIQUE INDEX "torque_events_supersedes_unique" ON "torque_events" USING btree ("supersedes_id");--> statement-breakpoint
CREATE UNIQUE INDEX "recall_exams_supersedes_unique" ON "recall_exams" USING btree ("supersedes_id");