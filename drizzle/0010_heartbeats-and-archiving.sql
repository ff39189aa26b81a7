CREATE TABLE "job_heartbeats" (
	"job_id" uuid PRIMARY KEY NOT NULL,
	"queue" text NOT NULL,
	"worker" text NOT NULL,
	"beat_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "calibrations" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "calibrations" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
CREATE INDEX "job_heartbeats_beat_at_idx" ON "job_heartbeats" USING btree ("beat_at");--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD CONSTRAINT "assumption_sets_archived_by_users_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_archived_by_users_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD CONSTRAINT "mitigation_options_archived_by_users_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD CONSTRAINT "policy_terms_sets_archived_by_users_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "assumption_sets_org_archived_idx" ON "assumption_sets" USING btree ("organisation_id","archived_at");--> statement-breakpoint
CREATE INDEX "assumption_sets_archived_by_idx" ON "assumption_sets" USING btree ("archived_by");--> statement-breakpoint
CREATE INDEX "calibrations_org_archived_idx" ON "calibrations" USING btree ("organisation_id","archived_at");--> statement-breakpoint
CREATE INDEX "calibrations_archived_by_idx" ON "calibrations" USING btree ("archived_by");--> statement-breakpoint
CREATE INDEX "mitigation_options_org_archived_idx" ON "mitigation_options" USING btree ("organisation_id","archived_at");--> statement-breakpoint
CREATE INDEX "mitigation_options_archived_by_idx" ON "mitigation_options" USING btree ("archived_by");--> statement-breakpoint
CREATE INDEX "policy_terms_sets_org_archived_idx" ON "policy_terms_sets" USING btree ("organisation_id","archived_at");--> statement-breakpoint
CREATE INDEX "policy_terms_sets_archived_by_idx" ON "policy_terms_sets" USING btree ("archived_by");