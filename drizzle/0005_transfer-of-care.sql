CREATE TABLE "discharge_checklists" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"referral_id" uuid,
	"recorded_by_user_id" text,
	"recorded_by_name" text NOT NULL,
	"organisation_id" uuid,
	"taught" text[] DEFAULT '{}'::text[] NOT NULL,
	"supplies_given" boolean NOT NULL,
	"supplies_days" integer,
	"drainage" text,
	"planned_twoc_on" date,
	"first_visit_on" date,
	"portal_activation_given" boolean NOT NULL,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "discharge_checklists_supplies_ck" CHECK ("discharge_checklists"."supplies_days" is null or ("discharge_checklists"."supplies_days" between 1 and 366))
);
--> statement-breakpoint
CREATE TABLE "referrals" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"from_organisation_id" uuid NOT NULL,
	"to_organisation_id" uuid NOT NULL,
	"referred_by_user_id" text,
	"handover_note" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"referrer_stays" boolean NOT NULL,
	"decline_reason" text,
	"answered_by_user_id" text,
	"answered_at" timestamp with time zone,
	"reminded_at" timestamp with time zone,
	"reminders" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "referrals_other_team_ck" CHECK ("referrals"."from_organisation_id" <> "referrals"."to_organisation_id"),
	CONSTRAINT "referrals_decline_reason_ck" CHECK ("referrals"."status" <> 'declined' or length(trim(coalesce("referrals"."decline_reason", ''))) > 0),
	CONSTRAINT "referrals_answered_ck" CHECK ("referrals"."status" = 'pending' or "referrals"."answered_at" is not null)
);
--> statement-breakpoint
ALTER TABLE "care_team" ADD COLUMN "lead" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "discharge_checklists" ADD CONSTRAINT "discharge_checklists_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "discharge_checklists" ADD CONSTRAINT "discharge_checklists_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "discharge_checklists" ADD CONSTRAINT "discharge_checklists_recorded_by_user_id_user_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "discharge_checklists" ADD CONSTRAINT "discharge_checklists_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_from_organisation_id_organisations_id_fk" FOREIGN KEY ("from_organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_to_organisation_id_organisations_id_fk" FOREIGN KEY ("to_organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_referred_by_user_id_user_id_fk" FOREIGN KEY ("referred_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_answered_by_user_id_user_id_fk" FOREIGN KEY ("answered_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "discharge_checklists_patient_idx" ON "discharge_checklists" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "referrals_patient_idx" ON "referrals" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "referrals_to_idx" ON "referrals" USING btree ("to_organisation_id","status");--> statement-breakpoint
CREATE INDEX "referrals_from_idx" ON "referrals" USING btree ("from_organisation_id","status");--> statement-breakpoint
CREATE UNIQUE INDEX "referrals_one_pending_uq" ON "referrals" USING btree ("patient_id","to_organisation_id") WHERE "referrals"."status" = 'pending';--> statement-breakpoint
CREATE UNIQUE INDEX "care_team_one_lead_uq" ON "care_team" USING btree ("patient_id") WHERE "care_team"."lead";