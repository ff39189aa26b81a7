CREATE TYPE "public"."storm_batch_source" AS ENUM('feed', 'upload');--> statement-breakpoint
CREATE TYPE "public"."storm_batch_state" AS ENUM('queued', 'processed', 'failed');--> statement-breakpoint
CREATE TYPE "public"."storm_record_type" AS ENUM('ground', 'cloud');--> statement-breakpoint
CREATE TYPE "public"."storm_window_state" AS ENUM('pending', 'computed');--> statement-breakpoint
CREATE TABLE "storm_alert_settings" (
	"organisation_id" uuid PRIMARY KEY NOT NULL,
	"ignition_threshold" double precision NOT NULL,
	"updated_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storm_alert_settings_threshold_range" CHECK ("storm_alert_settings"."ignition_threshold" > 0 AND "storm_alert_settings"."ignition_threshold" <= 1)
);
--> statement-breakpoint
CREATE TABLE "storm_alert_subscribers" (
	"organisation_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storm_alert_subscribers_organisation_id_user_id_pk" PRIMARY KEY("organisation_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "storm_alerts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"window_id" uuid NOT NULL,
	"ignition_threshold" double precision NOT NULL,
	"tanks" jsonb NOT NULL,
	"recipients" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "storm_batches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"feed_id" uuid,
	"source" "storm_batch_source" NOT NULL,
	"file_name" text DEFAULT '' NOT NULL,
	"sha256" text NOT NULL,
	"record_count" integer NOT NULL,
	"new_records" integer NOT NULL,
	"state" "storm_batch_state" DEFAULT 'queued' NOT NULL,
	"error" text,
	"processed_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storm_batches_counts" CHECK ("storm_batches"."record_count" >= 0 AND "storm_batches"."new_records" >= 0 AND "storm_batches"."new_records" <= "storm_batches"."record_count")
);
--> statement-breakpoint
CREATE TABLE "storm_feeds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"token_hash" text NOT NULL,
	"token_hint" text NOT NULL,
	"created_by" uuid,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storm_feeds_name_present" CHECK (length("storm_feeds"."name") > 0)
);
--> statement-breakpoint
CREATE TABLE "storm_flashes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"record_key" text NOT NULL,
	"batch_id" uuid,
	"window_id" uuid,
	"occurred_at" timestamp (3) with time zone NOT NULL,
	"lat_deg" double precision NOT NULL,
	"lon_deg" double precision NOT NULL,
	"peak_current_ka" double precision NOT NULL,
	"type" "storm_record_type" NOT NULL,
	"location_error_km" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "storm_tank_results" (
	"window_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"direct" double precision NOT NULL,
	"sparking" double precision NOT NULL,
	"ignition" double precision NOT NULL,
	"driving_flash_id" uuid,
	"driving_ignition" double precision NOT NULL,
	"fire_loss_property_damage" numeric(20, 2) NOT NULL,
	"fire_loss_interruption" numeric(20, 2) NOT NULL,
	CONSTRAINT "storm_tank_results_window_id_tank_id_pk" PRIMARY KEY("window_id","tank_id"),
	CONSTRAINT "storm_tank_results_probabilities" CHECK ("storm_tank_results"."direct" BETWEEN 0 AND 1 AND "storm_tank_results"."sparking" BETWEEN 0 AND 1 AND "storm_tank_results"."ignition" BETWEEN 0 AND 1)
);
--> statement-breakpoint
CREATE TABLE "storm_windows" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"starts_at" timestamp (3) with time zone NOT NULL,
	"ends_at" timestamp (3) with time zone NOT NULL,
	"flash_count" integer DEFAULT 0 NOT NULL,
	"state" "storm_window_state" DEFAULT 'pending' NOT NULL,
	"assumption_version_id" uuid,
	"engine_version" text,
	"computed_at" timestamp with time zone,
	"expected_fires" double precision DEFAULT 0 NOT NULL,
	"expected_ground_up_loss" numeric(20, 2) DEFAULT 0 NOT NULL,
	"summary" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storm_windows_order" CHECK ("storm_windows"."starts_at" <= "storm_windows"."ends_at")
);
--> statement-breakpoint
ALTER TABLE "storm_alert_settings" ADD CONSTRAINT "storm_alert_settings_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_alert_settings" ADD CONSTRAINT "storm_alert_settings_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_alert_subscribers" ADD CONSTRAINT "storm_alert_subscribers_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_alert_subscribers" ADD CONSTRAINT "storm_alert_subscribers_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_alerts" ADD CONSTRAINT "storm_alerts_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_alerts" ADD CONSTRAINT "storm_alerts_window_id_storm_windows_id_fk" FOREIGN KEY ("window_id") REFERENCES "public"."storm_windows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_batches" ADD CONSTRAINT "storm_batches_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_batches" ADD CONSTRAINT "storm_batches_feed_id_storm_feeds_id_fk" FOREIGN KEY ("feed_id") REFERENCES "public"."storm_feeds"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_batches" ADD CONSTRAINT "storm_batches_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_feeds" ADD CONSTRAINT "storm_feeds_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_feeds" ADD CONSTRAINT "storm_feeds_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_flashes" ADD CONSTRAINT "storm_flashes_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_flashes" ADD CONSTRAINT "storm_flashes_batch_id_storm_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."storm_batches"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_flashes" ADD CONSTRAINT "storm_flashes_window_id_storm_windows_id_fk" FOREIGN KEY ("window_id") REFERENCES "public"."storm_windows"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_tank_results" ADD CONSTRAINT "storm_tank_results_window_id_storm_windows_id_fk" FOREIGN KEY ("window_id") REFERENCES "public"."storm_windows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_tank_results" ADD CONSTRAINT "storm_tank_results_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_tank_results" ADD CONSTRAINT "storm_tank_results_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_tank_results" ADD CONSTRAINT "storm_tank_results_driving_flash_id_storm_flashes_id_fk" FOREIGN KEY ("driving_flash_id") REFERENCES "public"."storm_flashes"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_windows" ADD CONSTRAINT "storm_windows_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_windows" ADD CONSTRAINT "storm_windows_assumption_version_id_assumption_set_versions_id_fk" FOREIGN KEY ("assumption_version_id") REFERENCES "public"."assumption_set_versions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "storm_alert_settings_updated_by_idx" ON "storm_alert_settings" USING btree ("updated_by");--> statement-breakpoint
CREATE INDEX "storm_alert_subscribers_user_idx" ON "storm_alert_subscribers" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "storm_alerts_org_created_idx" ON "storm_alerts" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "storm_alerts_window_idx" ON "storm_alerts" USING btree ("window_id");--> statement-breakpoint
CREATE UNIQUE INDEX "storm_batches_org_sha_unique" ON "storm_batches" USING btree ("organisation_id","sha256");--> statement-breakpoint
CREATE INDEX "storm_batches_org_created_idx" ON "storm_batches" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "storm_batches_feed_idx" ON "storm_batches" USING btree ("feed_id");--> statement-breakpoint
CREATE INDEX "storm_batches_created_by_idx" ON "storm_batches" USING btree ("created_by");--> statement-breakpoint
CREATE UNIQUE INDEX "storm_feeds_token_hash_unique" ON "storm_feeds" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "storm_feeds_org_idx" ON "storm_feeds" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "storm_feeds_created_by_idx" ON "storm_feeds" USING btree ("created_by");--> statement-breakpoint
CREATE UNIQUE INDEX "storm_flashes_org_record_unique" ON "storm_flashes" USING btree ("organisation_id","record_key");--> statement-breakpoint
CREATE INDEX "storm_flashes_org_time_idx" ON "storm_flashes" USING btree ("organisation_id","occurred_at");--> statement-breakpoint
CREATE INDEX "storm_flashes_window_idx" ON "storm_flashes" USING btree ("window_id");--> statement-breakpoint
CREATE INDEX "storm_flashes_batch_idx" ON "storm_flashes" USING btree ("batch_id");--> statement-breakpoint
CREATE INDEX "storm_tank_results_window_ignition_idx" ON "storm_tank_results" USING btree ("window_id","ignition");--> statement-breakpoint
CREATE INDEX "storm_tank_results_tank_idx" ON "storm_tank_results" USING btree ("tank_id");--> statement-breakpoint
CREATE INDEX "storm_tank_results_site_idx" ON "storm_tank_results" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "storm_tank_results_flash_idx" ON "storm_tank_results" USING btree ("driving_flash_id");--> statement-breakpoint
CREATE INDEX "storm_windows_org_starts_idx" ON "storm_windows" USING btree ("organisation_id","starts_at");--> statement-breakpoint
CREATE INDEX "storm_windows_assumption_version_idx" ON "storm_windows" USING btree ("assumption_version_id");