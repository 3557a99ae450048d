-- The caseload's search index uses trigrams (pg_trgm ships with PostgreSQL and is a trusted extension).
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE INDEX "patients_search_trgm_idx" ON "patients" USING gin (lower("given_name" || ' ' || "family_name" || E'
' || "family_name" || ' ' || "given_name" || E'
' || "health_record_number") gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "patients_urgent_idx" ON "patients" USING btree ("id") WHERE "patients"."latest_check_in_level" in ('urgent', 'emergency');--> statement-breakpoint
CREATE INDEX "patients_follow_up_idx" ON "patients" USING btree ("follow_up_review_on") WHERE "patients"."follow_up_review_on" is not null;--> statement-breakpoint
CREATE INDEX "episodes_active_inserted_idx" ON "catheter_episodes" USING btree ("inserted_at") WHERE "catheter_episodes"."removed_at" is null;--> statement-breakpoint
CREATE INDEX "episodes_active_twoc_idx" ON "catheter_episodes" USING btree ("planned_change_on") WHERE "catheter_episodes"."removed_at" is null and ("catheter_episodes"."awaiting_twoc" or "catheter_episodes"."twoc_planned_on" is not null);--> statement-breakpoint
CREATE INDEX "episodes_trial_awaiting_idx" ON "catheter_episodes" USING btree ("patient_id") WHERE "catheter_episodes"."awaiting_twoc" and "catheter_episodes"."removed_at" is not null;