CREATE TYPE "public"."run_chunk_state" AS ENUM('pending', 'done');--> statement-breakpoint
CREATE TYPE "public"."run_mode" AS ENUM('frequency', 'year');--> statement-breakpoint
CREATE TYPE "public"."run_state" AS ENUM('queued', 'running', 'succeeded', 'failed', 'cancelled');--> statement-breakpoint
CREATE TABLE "assumption_set_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"assumption_set_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"parameters" jsonb NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"provenance" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"used_by_run" boolean DEFAULT false NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "assumption_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "run_chunks" (
	"run_id" uuid NOT NULL,
	"chunk_index" integer NOT NULL,
	"site_ids" jsonb NOT NULL,
	"state" "run_chunk_state" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"worker" text,
	"completed_at" timestamp with time zone,
	CONSTRAINT "run_chunks_run_id_chunk_index_pk" PRIMARY KEY("run_id","chunk_index")
);
--> statement-breakpoint
CREATE TABLE "run_portfolio_results" (
	"run_id" uuid PRIMARY KEY NOT NULL,
	"direct_rate" double precision NOT NULL,
	"direct_lo" double precision NOT NULL,
	"direct_hi" double precision NOT NULL,
	"sparking_rate" double precision NOT NULL,
	"sparking_lo" double precision NOT NULL,
	"sparking_hi" double precision NOT NULL,
	"ignition_rate" double precision NOT NULL,
	"ignition_lo" double precision NOT NULL,
	"ignition_hi" double precision NOT NULL,
	"expected_annual_loss" numeric(20, 2) NOT NULL,
	"expected_annual_loss_lo" numeric(20, 2) NOT NULL,
	"expected_annual_loss_hi" numeric(20, 2) NOT NULL,
	"direct_se" double precision NOT NULL,
	"sparking_se" double precision NOT NULL,
	"ignition_se" double precision NOT NULL,
	"expected_annual_loss_se" double precision NOT NULL,
	"year_summary" jsonb,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "run_site_results" (
	"run_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"radius_m" double precision NOT NULL,
	"lambda_per_year" double precision NOT NULL,
	"direct_rate" double precision NOT NULL,
	"direct_lo" double precision NOT NULL,
	"direct_hi" double precision NOT NULL,
	"sparking_rate" double precision NOT NULL,
	"sparking_lo" double precision NOT NULL,
	"sparking_hi" double precision NOT NULL,
	"ignition_rate" double precision NOT NULL,
	"ignition_lo" double precision NOT NULL,
	"ignition_hi" double precision NOT NULL,
	"expected_annual_loss" numeric(20, 2) NOT NULL,
	"expected_annual_loss_lo" numeric(20, 2) NOT NULL,
	"expected_annual_loss_hi" numeric(20, 2) NOT NULL,
	"direct_se" double precision NOT NULL,
	"sparking_se" double precision NOT NULL,
	"ignition_se" double precision NOT NULL,
	"expected_annual_loss_se" double precision NOT NULL,
	"samples" bigint NOT NULL,
	"year_summary" jsonb,
	"events" "bytea",
	"event_bands" jsonb,
	CONSTRAINT "run_site_results_run_id_site_id_pk" PRIMARY KEY("run_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "run_site_snapshots" (
	"run_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"site" jsonb NOT NULL,
	"facts" jsonb NOT NULL,
	CONSTRAINT "run_site_snapshots_run_id_site_id_pk" PRIMARY KEY("run_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "run_tank_results" (
	"run_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"tank_id" uuid NOT NULL,
	"tag" text NOT NULL,
	"direct_rate" double precision NOT NULL,
	"direct_lo" double precision NOT NULL,
	"direct_hi" double precision NOT NULL,
	"sparking_rate" double precision NOT NULL,
	"sparking_lo" double precision NOT NULL,
	"sparking_hi" double precision NOT NULL,
	"ignition_rate" double precision NOT NULL,
	"ignition_lo" double precision NOT NULL,
	"ignition_hi" double precision NOT NULL,
	"expected_annual_loss" numeric(20, 2) NOT NULL,
	"expected_annual_loss_lo" numeric(20, 2) NOT NULL,
	"expected_annual_loss_hi" numeric(20, 2) NOT NULL,
	"samples" bigint NOT NULL,
	"driving_component_class" text,
	"converged" boolean NOT NULL,
	CONSTRAINT "run_tank_results_run_id_tank_id_pk" PRIMARY KEY("run_id","tank_id")
);
--> statement-breakpoint
CREATE TABLE "runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"portfolio_id" uuid NOT NULL,
	"portfolio_name" text NOT NULL,
	"assumption_version_id" uuid NOT NULL,
	"mode" "run_mode" NOT NULL,
	"seed" bigint NOT NULL,
	"target_rse" double precision NOT NULL,
	"max_samples_per_tank" integer NOT NULL,
	"years" integer NOT NULL,
	"chunk_size" integer NOT NULL,
	"state" "run_state" DEFAULT 'queued' NOT NULL,
	"sites_total" integer NOT NULL,
	"sites_done" integer DEFAULT 0 NOT NULL,
	"tanks_total" integer NOT NULL,
	"chunks_total" integer NOT NULL,
	"chunks_done" integer DEFAULT 0 NOT NULL,
	"input_hash" text NOT NULL,
	"engine_version" text NOT NULL,
	"error_message" text,
	"requested_by" uuid,
	"retry_of" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "assumption_set_versions" ADD CONSTRAINT "assumption_set_versions_assumption_set_id_assumption_sets_id_fk" FOREIGN KEY ("assumption_set_id") REFERENCES "public"."assumption_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assumption_set_versions" ADD CONSTRAINT "assumption_set_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD CONSTRAINT "assumption_sets_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assumption_sets" ADD CONSTRAINT "assumption_sets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_chunks" ADD CONSTRAINT "run_chunks_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_portfolio_results" ADD CONSTRAINT "run_portfolio_results_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_site_results" ADD CONSTRAINT "run_site_results_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_site_snapshots" ADD CONSTRAINT "run_site_snapshots_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD CONSTRAINT "run_tank_results_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_assumption_version_id_assumption_set_versions_id_fk" FOREIGN KEY ("assumption_version_id") REFERENCES "public"."assumption_set_versions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "assumption_versions_set_version_unique" ON "assumption_set_versions" USING btree ("assumption_set_id","version");--> statement-breakpoint
CREATE UNIQUE INDEX "assumption_sets_org_name_unique" ON "assumption_sets" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "run_site_results_ignition_idx" ON "run_site_results" USING btree ("run_id","ignition_rate");--> statement-breakpoint
CREATE INDEX "run_site_snapshots_position_idx" ON "run_site_snapshots" USING btree ("run_id","position");--> statement-breakpoint
CREATE INDEX "run_tank_results_site_idx" ON "run_tank_results" USING btree ("run_id","site_id");--> statement-breakpoint
CREATE INDEX "run_tank_results_ignition_idx" ON "run_tank_results" USING btree ("run_id","ignition_rate");--> statement-breakpoint
CREATE INDEX "runs_org_created_idx" ON "runs" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "runs_portfolio_idx" ON "runs" USING btree ("portfolio_id");--> statement-breakpoint
CREATE INDEX "runs_state_idx" ON "runs" USING btree ("state");--> statement-breakpoint
CREATE INDEX "runs_assumption_version_idx" ON "runs" USING btree ("assumption_version_id");