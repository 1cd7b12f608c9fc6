ALTER TABLE "recall_exams" ADD COLUMN "baseline_exam_id" uuid;--> statement-breakpoint
CREATE INDEX "recall_exams_supersedes_idx" ON "recall_exams" USING btree ("supersedes_id");