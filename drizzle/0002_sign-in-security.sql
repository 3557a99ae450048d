CREATE TABLE "sign_in_throttles" (
	"account_key" text PRIMARY KEY NOT NULL,
	"user_id" text,
	"consecutive_failures" integer DEFAULT 0 NOT NULL,
	"blocked_until" timestamp with time zone,
	"window_started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"failed_attempts" integer DEFAULT 0 NOT NULL,
	"held_attempts" integer DEFAULT 0 NOT NULL,
	"second_step_failures" integer DEFAULT 0 NOT NULL,
	"address_hashes" text[] DEFAULT '{}'::text[] NOT NULL,
	"last_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"notified_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sign_in_throttles_counts_ck" CHECK ("sign_in_throttles"."consecutive_failures" >= 0 and "sign_in_throttles"."failed_attempts" >= 0 and "sign_in_throttles"."held_attempts" >= 0 and "sign_in_throttles"."second_step_failures" >= 0)
);
--> statement-breakpoint
ALTER TABLE "organisations" ALTER COLUMN "require_two_factor" SET DEFAULT true;--> statement-breakpoint
ALTER TABLE "session" ADD COLUMN "last_seen_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "two_factor_relaxed_reason" text;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "two_factor_relaxed_by_user_id" text;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "two_factor_relaxed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sign_in_throttles" ADD CONSTRAINT "sign_in_throttles_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "sign_in_throttles_user_idx" ON "sign_in_throttles" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sign_in_throttles_last_attempt_idx" ON "sign_in_throttles" USING btree ("last_attempt_at");--> statement-breakpoint
ALTER TABLE "organisations" ADD CONSTRAINT "organisations_two_factor_relaxed_by_user_id_user_id_fk" FOREIGN KEY ("two_factor_relaxed_by_user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisations" ADD CONSTRAINT "organisations_two_factor_reason_ck" CHECK ("organisations"."require_two_factor" or (length(trim(coalesce("organisations"."two_factor_relaxed_reason", ''))) >= 10 and "organisations"."two_factor_relaxed_at" is not null));