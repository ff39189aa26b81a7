ALTER TABLE "assumption_sets" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "calibrations" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "calibrations" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
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