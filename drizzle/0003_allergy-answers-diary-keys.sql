-- Allergies become yes / no / not-asked. A stored true stays an allergy ("yes"). A stored false is
-- "not-asked": the old form told nurses to leave the box unticked when there was none, so false
-- never proved anyone asked; the device checks then warn until someone records the answer.
-- (The USING clauses were added to the generated SQL: drizzle-kit cannot say how to map the values.)
ALTER TABLE "patients" ALTER COLUMN "allergy_latex" DROP DEFAULT;--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_latex" SET DATA TYPE text USING (CASE WHEN "allergy_latex" THEN 'yes' ELSE 'not-asked' END);--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_latex" SET DEFAULT 'not-asked';--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_chlorhexidine" DROP DEFAULT;--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_chlorhexidine" SET DATA TYPE text USING (CASE WHEN "allergy_chlorhexidine" THEN 'yes' ELSE 'not-asked' END);--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_chlorhexidine" SET DEFAULT 'not-asked';--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_lidocaine" DROP DEFAULT;--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_lidocaine" SET DATA TYPE text USING (CASE WHEN "allergy_lidocaine" THEN 'yes' ELSE 'not-asked' END);--> statement-breakpoint
ALTER TABLE "patients" ALTER COLUMN "allergy_lidocaine" SET DEFAULT 'not-asked';--> statement-breakpoint
ALTER TABLE "diary_entries" ADD COLUMN "client_key" uuid;--> statement-breakpoint
ALTER TABLE "diary_entries" ADD CONSTRAINT "diary_entries_client_key_unique" UNIQUE("client_key");--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_allergy_answers_ck" CHECK ("patients"."allergy_latex" in ('yes', 'no', 'not-asked') and "patients"."allergy_chlorhexidine" in ('yes', 'no', 'not-asked') and "patients"."allergy_lidocaine" in ('yes', 'no', 'not-asked'));