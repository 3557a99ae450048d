CREATE TABLE "push_subscriptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"endpoint" text NOT NULL,
	"p256dh" text NOT NULL,
	"auth" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reach_settings" (
	"user_id" text PRIMARY KEY NOT NULL,
	"phone" text,
	"sms_consent_at" timestamp with time zone,
	"quiet_start" text DEFAULT '22:00' NOT NULL,
	"quiet_end" text DEFAULT '07:00' NOT NULL,
	"reminders" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reach_settings_phone_ck" CHECK ("reach_settings"."phone" is null or "reach_settings"."phone" ~ '^\+[1-9][0-9]{6,14}$'),
	CONSTRAINT "reach_settings_quiet_ck" CHECK ("reach_settings"."quiet_start" ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$' and "reach_settings"."quiet_end" ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$')
);
--> statement-breakpoint
ALTER TABLE "carer_links" ADD COLUMN "alert_channel" text DEFAULT 'email' NOT NULL;--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD COLUMN "channel" text DEFAULT 'email' NOT NULL;--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD COLUMN "link" text;--> statement-breakpoint
ALTER TABLE "push_subscriptions" ADD CONSTRAINT "push_subscriptions_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reach_settings" ADD CONSTRAINT "reach_settings_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "push_subscriptions_endpoint_idx" ON "push_subscriptions" USING btree ("endpoint");--> statement-breakpoint
CREATE INDEX "push_subscriptions_user_idx" ON "push_subscriptions" USING btree ("user_id");--> statement-breakpoint
ALTER TABLE "carer_links" ADD CONSTRAINT "carer_links_alert_channel_ck" CHECK ("carer_links"."alert_channel" in ('email', 'push', 'sms'));--> statement-breakpoint
ALTER TABLE "outbound_messages" ADD CONSTRAINT "outbox_channel_ck" CHECK ("outbound_messages"."channel" in ('email', 'sms', 'push'));