ALTER TABLE "patients" ADD COLUMN "catheter_discharged_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "follow_up_review_on" date;--> statement-breakpoint
ALTER TABLE "catheter_episodes" ADD COLUMN "twoc_planned_on" date;--> statement-breakpoint
ALTER TABLE "catheter_episodes" ADD COLUMN "twoc_medicine_note" text;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_follow_up_ck" CHECK ("patients"."follow_up_review_on" is null or "patients"."catheter_discharged_at" is not null);