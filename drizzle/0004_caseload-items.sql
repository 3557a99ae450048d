CREATE TABLE "caseload_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"level" text,
	"check_in_id" uuid,
	"observation_id" uuid,
	"event_id" uuid,
	"summary" text NOT NULL,
	"reporter" jsonb,
	"reporter_notes" text,
	"due_at" timestamp with time zone,
	"resent_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"closed_by_user_id" text,
	"closed_by_name" text,
	"action" text,
	"note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "caseload_items_closed_ck" CHECK ("caseload_items"."closed_at" is null or ("caseload_items"."closed_by_name" is not null and ("caseload_items"."kind" = 'sample-result' or "caseload_items"."action" is not null))),
	CONSTRAINT "caseload_items_other_note_ck" CHECK ("caseload_items"."action" is distinct from 'other' or length(trim(coalesce("caseload_items"."note", ''))) > 0)
);
--> statement-breakpoint
ALTER TABLE "caseload_items" ADD CONSTRAINT "caseload_items_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "caseload_items" ADD CONSTRAINT "caseload_items_check_in_id_check_ins_id_fk" FOREIGN KEY ("check_in_id") REFERENCES "public"."check_ins"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "caseload_items" ADD CONSTRAINT "caseload_items_observation_id_observations_id_fk" FOREIGN KEY ("observation_id") REFERENCES "public"."observations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "caseload_items" ADD CONSTRAINT "caseload_items_event_id_episode_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."episode_events"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "caseload_items" ADD CONSTRAINT "caseload_items_closed_by_user_id_user_id_fk" FOREIGN KEY ("closed_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "caseload_items_patient_idx" ON "caseload_items" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "caseload_items_open_idx" ON "caseload_items" USING btree ("due_at") WHERE "caseload_items"."closed_at" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "caseload_items_check_in_uq" ON "caseload_items" USING btree ("check_in_id");--> statement-breakpoint
CREATE UNIQUE INDEX "caseload_items_observation_uq" ON "caseload_items" USING btree ("observation_id");