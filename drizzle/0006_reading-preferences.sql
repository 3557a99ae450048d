CREATE TABLE "reading_preferences" (
	"user_id" text PRIMARY KEY NOT NULL,
	"text_size" integer DEFAULT 0 NOT NULL,
	"contrast" text DEFAULT 'standard' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reading_preferences_text_size" CHECK ("reading_preferences"."text_size" between 0 and 3)
);
--> statement-breakpoint
ALTER TABLE "reading_preferences" ADD CONSTRAINT "reading_preferences_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;