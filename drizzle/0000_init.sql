CREATE TABLE "account" (
	"id" text PRIMARY KEY NOT NULL,
	"account_id" text NOT NULL,
	"provider_id" text NOT NULL,
	"user_id" text NOT NULL,
	"access_token" text,
	"refresh_token" text,
	"id_token" text,
	"access_token_expires_at" timestamp with time zone,
	"refresh_token_expires_at" timestamp with time zone,
	"scope" text,
	"password" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rate_limit" (
	"id" text PRIMARY KEY NOT NULL,
	"key" text NOT NULL,
	"count" integer NOT NULL,
	"last_request" bigint NOT NULL,
	CONSTRAINT "rate_limit_key_unique" UNIQUE("key")
);
--> statement-breakpoint
CREATE TABLE "session" (
	"id" text PRIMARY KEY NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"token" text NOT NULL,
	"ip_address" text,
	"user_agent" text,
	"user_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "session_token_unique" UNIQUE("token")
);
--> statement-breakpoint
CREATE TABLE "two_factor" (
	"id" text PRIMARY KEY NOT NULL,
	"secret" text NOT NULL,
	"backup_codes" text NOT NULL,
	"user_id" text NOT NULL,
	"verified" boolean DEFAULT true NOT NULL,
	"failed_verification_count" integer DEFAULT 0 NOT NULL,
	"locked_until" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "user" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"email" text NOT NULL,
	"email_verified" boolean DEFAULT false NOT NULL,
	"image" text,
	"role" text DEFAULT 'patient' NOT NULL,
	"locale" text DEFAULT 'en' NOT NULL,
	"deactivated_at" timestamp with time zone,
	"two_factor_enabled" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "user_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "verification" (
	"id" text PRIMARY KEY NOT NULL,
	"identifier" text NOT NULL,
	"value" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "attempt_counters" (
	"key" text PRIMARY KEY NOT NULL,
	"count" integer NOT NULL,
	"window_started_at" timestamp with time zone NOT NULL,
	CONSTRAINT "attempt_counters_count_ck" CHECK ("attempt_counters"."count" >= 0)
);
--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_user_id" text,
	"actor_role" text,
	"action" text NOT NULL,
	"patient_id" uuid,
	"organisation_id" uuid,
	"via" text,
	"reason" text,
	"ip_hash" text,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "bag_changes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"changed_on" date NOT NULL,
	"recorded_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_team" (
	"patient_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_team_patient_id_organisation_id_pk" PRIMARY KEY("patient_id","organisation_id")
);
--> statement-breakpoint
CREATE TABLE "carer_links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"carer_user_id" text,
	"invited_email" text NOT NULL,
	"invited_by_user_id" text,
	"invite_token_hash" text,
	"invite_expires_at" timestamp with time zone,
	"status" text DEFAULT 'pending' NOT NULL,
	"accepted_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "carer_links_invite_token_hash_unique" UNIQUE("invite_token_hash")
);
--> statement-breakpoint
CREATE TABLE "catheter_episodes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"organisation_id" uuid,
	"previous_episode_id" uuid,
	"route" text NOT NULL,
	"catheter_type" text NOT NULL,
	"material" text NOT NULL,
	"length_category" text NOT NULL,
	"size_ch" integer NOT NULL,
	"balloon_ml" integer NOT NULL,
	"maker_balloon_ml" integer,
	"maker" text,
	"product_name" text,
	"lot" text,
	"expiry" date,
	"gtin" text,
	"serial" text,
	"udi" text,
	"indication" text NOT NULL,
	"inserted_at" timestamp with time zone NOT NULL,
	"inserted_by_user_id" text,
	"inserted_by_name" text NOT NULL,
	"gel_kind" text DEFAULT 'none' NOT NULL,
	"gel_volume_ml" numeric(4, 1),
	"residual_urine_ml" integer,
	"urine_description" text,
	"specimen_taken" boolean DEFAULT false NOT NULL,
	"attempts" integer DEFAULT 1 NOT NULL,
	"difficulties" text,
	"patient_reaction" text,
	"larger_size_reason" text,
	"max_dwell_days" integer,
	"review_interval_days" integer,
	"planned_change_on" date NOT NULL,
	"review_due_on" date NOT NULL,
	"findings" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"overrides" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"awaiting_twoc" boolean DEFAULT false NOT NULL,
	"removed_at" timestamp with time zone,
	"removal_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "episodes_size_ck" CHECK ("catheter_episodes"."size_ch" between 6 and 30),
	CONSTRAINT "episodes_balloon_ck" CHECK ("catheter_episodes"."balloon_ml" > 0 and "catheter_episodes"."balloon_ml" <= 30),
	CONSTRAINT "episodes_maker_balloon_ck" CHECK ("catheter_episodes"."maker_balloon_ml" is null or "catheter_episodes"."maker_balloon_ml" > 0),
	CONSTRAINT "episodes_gel_volume_ck" CHECK ("catheter_episodes"."gel_volume_ml" is null or "catheter_episodes"."gel_volume_ml" >= 0),
	CONSTRAINT "episodes_residual_ck" CHECK ("catheter_episodes"."residual_urine_ml" is null or "catheter_episodes"."residual_urine_ml" >= 0),
	CONSTRAINT "episodes_attempts_ck" CHECK ("catheter_episodes"."attempts" >= 1),
	CONSTRAINT "episodes_dwell_ck" CHECK ("catheter_episodes"."max_dwell_days" is null or "catheter_episodes"."max_dwell_days" > 0),
	CONSTRAINT "episodes_removed_ck" CHECK ("catheter_episodes"."removed_at" is null or "catheter_episodes"."removed_at" >= "catheter_episodes"."inserted_at")
);
--> statement-breakpoint
CREATE TABLE "check_ins" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"reported_by_user_id" text,
	"answers" jsonb NOT NULL,
	"level" text NOT NULL,
	"rule_ids" text[] NOT NULL,
	"idempotency_key" text NOT NULL,
	"answered_at" timestamp with time zone,
	"reviewed_at" timestamp with time zone,
	"reviewed_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "check_ins_idempotency_key_unique" UNIQUE("idempotency_key")
);
--> statement-breakpoint
CREATE TABLE "diary_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"volume_ml" integer NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"recorded_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "diary_volume_ck" CHECK ("diary_entries"."volume_ml" > 0 and "diary_entries"."volume_ml" <= 5000)
);
--> statement-breakpoint
CREATE TABLE "episode_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"episode_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"reason" text,
	"twoc_outcome" text,
	"notes" text,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"occurred_at" timestamp with time zone NOT NULL,
	"recorded_by_user_id" text,
	"recorded_by_name" text NOT NULL,
	"organisation_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "events_reason_ck" CHECK ("episode_events"."kind" <> 'unplanned_change' or "episode_events"."reason" is not null),
	CONSTRAINT "events_twoc_ck" CHECK ("episode_events"."kind" <> 'twoc_outcome' or "episode_events"."twoc_outcome" is not null)
);
--> statement-breakpoint
CREATE TABLE "memberships" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"organisation_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "observations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"event_id" uuid,
	"taken_at" timestamp with time zone NOT NULL,
	"respiration_rate" integer NOT NULL,
	"spo2" integer NOT NULL,
	"spo2_scale" integer NOT NULL,
	"on_oxygen" boolean NOT NULL,
	"systolic_bp" integer NOT NULL,
	"pulse" integer NOT NULL,
	"consciousness" text NOT NULL,
	"temperature_c" numeric(3, 1) NOT NULL,
	"news2_total" integer NOT NULL,
	"news2_subscores" jsonb NOT NULL,
	"news2_risk" text NOT NULL,
	"news2_response" text NOT NULL,
	"recorded_by_user_id" text,
	"recorded_by_name" text NOT NULL,
	"organisation_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "observations_scale_ck" CHECK ("observations"."spo2_scale" in (1, 2)),
	CONSTRAINT "observations_total_ck" CHECK ("observations"."news2_total" between 0 and 20),
	CONSTRAINT "observations_rr_ck" CHECK ("observations"."respiration_rate" between 0 and 80),
	CONSTRAINT "observations_spo2_ck" CHECK ("observations"."spo2" between 20 and 100),
	CONSTRAINT "observations_sbp_ck" CHECK ("observations"."systolic_bp" between 40 and 300),
	CONSTRAINT "observations_pulse_ck" CHECK ("observations"."pulse" between 20 and 300),
	CONSTRAINT "observations_temp_ck" CHECK ("observations"."temperature_c" between 25 and 45)
);
--> statement-breakpoint
CREATE TABLE "organisations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"parent_name" text,
	"phone" text,
	"out_of_hours_phone" text,
	"inbox_email" text,
	"locale" text DEFAULT 'en' NOT NULL,
	"languages" text[] DEFAULT '{en}'::text[] NOT NULL,
	"require_two_factor" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "outbound_messages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"idempotency_key" text NOT NULL,
	"message_id" text NOT NULL,
	"kind" text NOT NULL,
	"to_address" text NOT NULL,
	"subject" text NOT NULL,
	"html" text NOT NULL,
	"text" text NOT NULL,
	"attachments" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"locale" text DEFAULT 'en' NOT NULL,
	"patient_id" uuid,
	"organisation_id" uuid,
	"source_id" text,
	"resend_of_id" uuid,
	"created_by_user_id" text,
	"redact_after_send" boolean DEFAULT false NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"claim_token" uuid,
	"lease_until" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "outbound_messages_idempotency_key_unique" UNIQUE("idempotency_key"),
	CONSTRAINT "outbox_attempts_ck" CHECK ("outbound_messages"."attempts" >= 0),
	CONSTRAINT "outbox_sent_ck" CHECK ("outbound_messages"."status" <> 'sent' or "outbound_messages"."sent_at" is not null),
	CONSTRAINT "outbox_sending_ck" CHECK ("outbound_messages"."status" <> 'sending' or ("outbound_messages"."lease_until" is not null and "outbound_messages"."claim_token" is not null)),
	CONSTRAINT "outbox_to_ck" CHECK ("outbound_messages"."to_address" <> '' or "outbound_messages"."status" = 'failed')
);
--> statement-breakpoint
CREATE TABLE "passports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"token_hash" text NOT NULL,
	"short_code_hash" text NOT NULL,
	"languages" text[] NOT NULL,
	"issued_by_user_id" text,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "passports_token_hash_unique" UNIQUE("token_hash"),
	CONSTRAINT "passports_short_code_hash_unique" UNIQUE("short_code_hash")
);
--> statement-breakpoint
CREATE TABLE "patient_invites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"code_hash" text NOT NULL,
	"email" text,
	"created_by_user_id" text,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "patient_invites_code_hash_unique" UNIQUE("code_hash")
);
--> statement-breakpoint
CREATE TABLE "patients" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text,
	"given_name" text NOT NULL,
	"family_name" text NOT NULL,
	"health_record_number" text NOT NULL,
	"date_of_birth" date NOT NULL,
	"sex" text NOT NULL,
	"preferred_locale" text DEFAULT 'en' NOT NULL,
	"weight_kg" numeric(5, 1),
	"phone" text,
	"allergy_latex" boolean DEFAULT false NOT NULL,
	"allergy_chlorhexidine" boolean DEFAULT false NOT NULL,
	"allergy_lidocaine" boolean DEFAULT false NOT NULL,
	"allergy_other" text,
	"gp_practice_id" uuid,
	"fluid_limit_ml" integer,
	"latest_check_in_level" text,
	"latest_check_in_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "patients_user_id_unique" UNIQUE("user_id"),
	CONSTRAINT "patients_weight_ck" CHECK ("patients"."weight_kg" is null or ("patients"."weight_kg" > 0 and "patients"."weight_kg" < 500)),
	CONSTRAINT "patients_fluid_limit_ck" CHECK ("patients"."fluid_limit_ml" is null or "patients"."fluid_limit_ml" > 0)
);
--> statement-breakpoint
CREATE TABLE "settings" (
	"key" text PRIMARY KEY NOT NULL,
	"value" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "staff_invitation_organisations" (
	"invitation_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	CONSTRAINT "staff_invitation_organisations_invitation_id_organisation_id_pk" PRIMARY KEY("invitation_id","organisation_id")
);
--> statement-breakpoint
CREATE TABLE "staff_invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text,
	"role" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"invited_by_user_id" text,
	"accepted_at" timestamp with time zone,
	"accepted_user_id" text,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "staff_invitations_token_hash_unique" UNIQUE("token_hash"),
	CONSTRAINT "staff_invitations_expiry_ck" CHECK ("staff_invitations"."expires_at" > "staff_invitations"."created_at")
);
--> statement-breakpoint
CREATE TABLE "supply_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"episode_id" uuid,
	"gp_practice_id" uuid,
	"period_days" integer NOT NULL,
	"items" jsonb NOT NULL,
	"note" text,
	"requested_by_user_id" text,
	"requested_by_name" text NOT NULL,
	"message_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "supply_requests_period_ck" CHECK ("supply_requests"."period_days" between 1 and 366)
);
--> statement-breakpoint
CREATE TABLE "uploads" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"uploaded_by_user_id" text,
	"category" text NOT NULL,
	"object_key" text NOT NULL,
	"label" text NOT NULL,
	"content_type" text,
	"size_bytes" integer,
	"status" text DEFAULT 'pending' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "uploads_object_key_unique" UNIQUE("object_key"),
	CONSTRAINT "uploads_size_ck" CHECK ("uploads"."size_bytes" is null or "uploads"."size_bytes" > 0)
);
--> statement-breakpoint
CREATE TABLE "visit_access" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"reason" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "account" ADD CONSTRAINT "account_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session" ADD CONSTRAINT "session_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "two_factor" ADD CONSTRAINT "two_factor_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_actor_user_id_user_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bag_changes" ADD CONSTRAINT "bag_changes_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bag_changes" ADD CONSTRAINT "bag_changes_recorded_by_user_id_user_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_team" ADD CONSTRAINT "care_team_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_team" ADD CONSTRAINT "care_team_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "carer_links" ADD CONSTRAINT "carer_links_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "carer_links" ADD CONSTRAINT "carer_links_carer_user_id_user_id_fk" FOREIGN KEY ("carer_user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "carer_links" ADD CONSTRAINT "carer_links_invited_by_user_id_user_id_fk" FOREIGN KEY ("invited_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catheter_episodes" ADD CONSTRAINT "catheter_episodes_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catheter_episodes" ADD CONSTRAINT "catheter_episodes_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catheter_episodes" ADD CONSTRAINT "catheter_episodes_inserted_by_user_id_user_id_fk" FOREIGN KEY ("inserted_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_ins" ADD CONSTRAINT "check_ins_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_ins" ADD CONSTRAINT "check_ins_reported_by_user_id_user_id_fk" FOREIGN KEY ("reported_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_ins" ADD CONSTRAINT "check_ins_reviewed_by_user_id_user_id_fk" FOREIGN KEY ("reviewed_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diary_entries" ADD CONSTRAINT "diary_entries_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diary_entries" ADD CONSTRAINT "diary_entries_recorded_by_user_id_user_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "episode_events" ADD CONSTRAINT "episode_events_episode_id_catheter_episodes_id_fk" FOREIGN KEY ("episode_id") REFERENCES "public"."catheter_episodes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "episode_events" ADD CONSTRAINT "episode_events_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "episode_events" ADD CONSTRAINT "episode_events_recorded_by_user_id_user_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "episode_events" ADD CONSTRAINT "episode_events_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_event_id_episode_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."episode_events"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_recorded_by_user_id_user_id_fk" FOREIGN KEY ("recorded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD CONSTRAINT "outbound_messages_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD CONSTRAINT "outbound_messages_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD CONSTRAINT "outbound_messages_created_by_user_id_user_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "passports" ADD CONSTRAINT "passports_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "passports" ADD CONSTRAINT "passports_issued_by_user_id_user_id_fk" FOREIGN KEY ("issued_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_invites" ADD CONSTRAINT "patient_invites_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_invites" ADD CONSTRAINT "patient_invites_created_by_user_id_user_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_gp_practice_id_organisations_id_fk" FOREIGN KEY ("gp_practice_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "staff_invitation_organisations" ADD CONSTRAINT "staff_invitation_organisations_invitation_id_staff_invitations_id_fk" FOREIGN KEY ("invitation_id") REFERENCES "public"."staff_invitations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "staff_invitation_organisations" ADD CONSTRAINT "staff_invitation_organisations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "staff_invitations" ADD CONSTRAINT "staff_invitations_invited_by_user_id_user_id_fk" FOREIGN KEY ("invited_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "staff_invitations" ADD CONSTRAINT "staff_invitations_accepted_user_id_user_id_fk" FOREIGN KEY ("accepted_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supply_requests" ADD CONSTRAINT "supply_requests_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supply_requests" ADD CONSTRAINT "supply_requests_episode_id_catheter_episodes_id_fk" FOREIGN KEY ("episode_id") REFERENCES "public"."catheter_episodes"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supply_requests" ADD CONSTRAINT "supply_requests_gp_practice_id_organisations_id_fk" FOREIGN KEY ("gp_practice_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supply_requests" ADD CONSTRAINT "supply_requests_requested_by_user_id_user_id_fk" FOREIGN KEY ("requested_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supply_requests" ADD CONSTRAINT "supply_requests_message_id_outbound_messages_id_fk" FOREIGN KEY ("message_id") REFERENCES "public"."outbound_messages"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_uploaded_by_user_id_user_id_fk" FOREIGN KEY ("uploaded_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_access" ADD CONSTRAINT "visit_access_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_access" ADD CONSTRAINT "visit_access_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "account_user_id_idx" ON "account" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "session_user_id_idx" ON "session" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "two_factor_user_id_idx" ON "two_factor" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "verification_identifier_idx" ON "verification" USING btree ("identifier");--> statement-breakpoint
CREATE INDEX "attempt_counters_window_idx" ON "attempt_counters" USING btree ("window_started_at");--> statement-breakpoint
CREATE INDEX "audit_patient_idx" ON "audit_events" USING btree ("patient_id","at");--> statement-breakpoint
CREATE INDEX "audit_actor_idx" ON "audit_events" USING btree ("actor_user_id","at");--> statement-breakpoint
CREATE INDEX "audit_at_idx" ON "audit_events" USING btree ("at");--> statement-breakpoint
CREATE INDEX "bag_changes_patient_idx" ON "bag_changes" USING btree ("patient_id","kind","changed_on");--> statement-breakpoint
CREATE INDEX "care_team_org_idx" ON "care_team" USING btree ("organisation_id","patient_id");--> statement-breakpoint
CREATE INDEX "carer_links_patient_idx" ON "carer_links" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "carer_links_carer_idx" ON "carer_links" USING btree ("carer_user_id","status");--> statement-breakpoint
CREATE INDEX "episodes_patient_idx" ON "catheter_episodes" USING btree ("patient_id","inserted_at");--> statement-breakpoint
CREATE UNIQUE INDEX "episodes_one_active_uq" ON "catheter_episodes" USING btree ("patient_id") WHERE "catheter_episodes"."removed_at" is null;--> statement-breakpoint
CREATE INDEX "episodes_active_change_idx" ON "catheter_episodes" USING btree ("planned_change_on") WHERE "catheter_episodes"."removed_at" is null;--> statement-breakpoint
CREATE INDEX "episodes_active_review_idx" ON "catheter_episodes" USING btree ("review_due_on") WHERE "catheter_episodes"."removed_at" is null;--> statement-breakpoint
CREATE INDEX "check_ins_patient_idx" ON "check_ins" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "diary_patient_at_idx" ON "diary_entries" USING btree ("patient_id","at");--> statement-breakpoint
CREATE INDEX "events_patient_idx" ON "episode_events" USING btree ("patient_id","occurred_at");--> statement-breakpoint
CREATE INDEX "events_episode_idx" ON "episode_events" USING btree ("episode_id");--> statement-breakpoint
CREATE UNIQUE INDEX "memberships_user_org_uq" ON "memberships" USING btree ("user_id","organisation_id");--> statement-breakpoint
CREATE INDEX "memberships_org_idx" ON "memberships" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "observations_patient_idx" ON "observations" USING btree ("patient_id","taken_at");--> statement-breakpoint
CREATE INDEX "observations_event_idx" ON "observations" USING btree ("event_id");--> statement-breakpoint
CREATE UNIQUE INDEX "organisations_name_kind_uq" ON "organisations" USING btree ("name","kind");--> statement-breakpoint
CREATE INDEX "organisations_kind_idx" ON "organisations" USING btree ("kind");--> statement-breakpoint
CREATE INDEX "outbox_status_idx" ON "outbound_messages" USING btree ("status","next_attempt_at");--> statement-breakpoint
CREATE INDEX "outbox_lease_idx" ON "outbound_messages" USING btree ("lease_until") WHERE "outbound_messages"."status" = 'sending';--> statement-breakpoint
CREATE INDEX "outbox_patient_idx" ON "outbound_messages" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "outbox_resend_of_idx" ON "outbound_messages" USING btree ("resend_of_id");--> statement-breakpoint
CREATE INDEX "passports_patient_idx" ON "passports" USING btree ("patient_id");--> statement-breakpoint
CREATE UNIQUE INDEX "passports_one_current_uq" ON "passports" USING btree ("patient_id") WHERE "passports"."revoked_at" is null;--> statement-breakpoint
CREATE INDEX "patient_invites_patient_idx" ON "patient_invites" USING btree ("patient_id");--> statement-breakpoint
CREATE UNIQUE INDEX "patient_invites_one_live_uq" ON "patient_invites" USING btree ("patient_id") WHERE "patient_invites"."used_at" is null and "patient_invites"."revoked_at" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "patients_hrn_uq" ON "patients" USING btree ("health_record_number");--> statement-breakpoint
CREATE INDEX "patients_family_name_idx" ON "patients" USING btree (lower("family_name"));--> statement-breakpoint
CREATE INDEX "patients_gp_idx" ON "patients" USING btree ("gp_practice_id");--> statement-breakpoint
CREATE INDEX "staff_invitation_orgs_org_idx" ON "staff_invitation_organisations" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "staff_invitations_email_idx" ON "staff_invitations" USING btree (lower("email"));--> statement-breakpoint
CREATE UNIQUE INDEX "staff_invitations_one_open_uq" ON "staff_invitations" USING btree (lower("email")) WHERE "staff_invitations"."accepted_at" is null and "staff_invitations"."revoked_at" is null;--> statement-breakpoint
CREATE INDEX "supply_requests_patient_idx" ON "supply_requests" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "uploads_patient_idx" ON "uploads" USING btree ("patient_id","created_at");--> statement-breakpoint
CREATE INDEX "visit_access_user_patient_idx" ON "visit_access" USING btree ("user_id","patient_id","expires_at");