ALTER TABLE "practices" ADD COLUMN "cantilever_ratio_limit" numeric(3, 1) DEFAULT 1.5 NOT NULL;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "provisional" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "planned_replacement_on" date;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "cantilever_left_mm" numeric(4, 1);--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "cantilever_right_mm" numeric(4, 1);--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "ap_spread_mm" numeric(4, 1);--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "replaced_by_id" uuid;--> statement-breakpoint
ALTER TABLE "restorations" ADD CONSTRAINT "restorations_replaced_by_id_restorations_id_fk" FOREIGN KEY ("replaced_by_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "restorations_provisional_due_idx" ON "restorations" USING btree ("practice_id","planned_replacement_on") WHERE "restorations"."provisional" and "restorations"."status" = 'delivered';