CREATE TYPE "public"."capital_evaluation_state" AS ENUM('queued', 'running', 'succeeded', 'failed');--> statement-breakpoint
CREATE TYPE "public"."cost_basis" AS ENUM('each', 'diameter_m', 'height_m', 'component_count', 'volume_m3');--> statement-breakpoint
CREATE TYPE "public"."mitigation_kind" AS ENUM('shield', 'remove_class', 'steel_tank', 'vapour_control', 'mast', 'grounding', 'static_dissipator');--> statement-breakpoint
CREATE TYPE "public"."plan_metric" AS ENUM('loss', 'ignition');--> statement-breakpoint
CREATE TABLE "capital_actions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"option_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"tank_id" uuid,
	"mast_x_m" double precision,
	"mast_y_m" double precision,
	"cost" numeric(16, 2) NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "capital_actions_cost_nonnegative" CHECK ("capital_actions"."cost" >= 0)
);
--> statement-breakpoint
CREATE TABLE "capital_evaluation_sites" (
	"evaluation_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"site_name" text NOT NULL,
	"site" jsonb NOT NULL,
	"scenarios" jsonb NOT NULL,
	"done" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "capital_evaluation_sites_evaluation_id_site_id_pk" PRIMARY KEY("evaluation_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "capital_evaluations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"assumption_version_id" uuid NOT NULL,
	"plan_id" uuid,
	"seed" integer NOT NULL,
	"samples_per_tank" integer NOT NULL,
	"state" "capital_evaluation_state" DEFAULT 'queued' NOT NULL,
	"sites_total" integer NOT NULL,
	"sites_done" integer DEFAULT 0 NOT NULL,
	"error" text,
	"requested_by" uuid,
	"finished_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "capital_plans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"budget" numeric(16, 2) NOT NULL,
	"metric" "plan_metric" NOT NULL,
	"evaluation_id" uuid,
	"action_ids" jsonb NOT NULL,
	"total_cost" numeric(16, 2) NOT NULL,
	"reduction" double precision NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "capital_plans_budget_nonnegative" CHECK ("capital_plans"."budget" >= 0 AND "capital_plans"."total_cost" <= "capital_plans"."budget")
);
--> statement-breakpoint
CREATE TABLE "capital_scenario_results" (
	"evaluation_id" uuid NOT NULL,
	"key" text NOT NULL,
	"site_id" uuid NOT NULL,
	"action_ids" jsonb NOT NULL,
	"figures" jsonb NOT NULL,
	"reduction_ignition" double precision NOT NULL,
	"reduction_loss" double precision NOT NULL,
	CONSTRAINT "capital_scenario_results_evaluation_id_key_pk" PRIMARY KEY("evaluation_id","key")
);
--> statement-breakpoint
CREATE TABLE "mitigation_options" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"kind" "mitigation_kind" NOT NULL,
	"name" text NOT NULL,
	"shield_rating_ka" double precision,
	"component_class" "component_class",
	"mast_height_m" double precision,
	"mast_radius_m" double precision,
	"fixed_cost" numeric(16, 2) DEFAULT 0 NOT NULL,
	"rate" numeric(16, 2) DEFAULT 0 NOT NULL,
	"cost_basis" "cost_basis" DEFAULT 'each' NOT NULL,
	"cost_step" numeric(16, 2) DEFAULT 100 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "mitigation_options_costs_nonnegative" CHECK ("mitigation_options"."fixed_cost" >= 0 AND "mitigation_options"."rate" >= 0 AND "mitigation_options"."cost_step" > 0),
	CONSTRAINT "mitigation_options_shield_rating" CHECK ("mitigation_options"."shield_rating_ka" IS NULL OR "mitigation_options"."shield_rating_ka" > 0),
	CONSTRAINT "mitigation_options_mast" CHECK ("mitigation_options"."mast_height_m" IS NULL OR "mitigation_options"."mast_height_m" > 0)
);
--> statement-breakpoint
ALTER TABLE "capital_actions" ADD CONSTRAINT "capital_actions_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_actions" ADD CONSTRAINT "capital_actions_option_id_mitigation_options_id_fk" FOREIGN KEY ("option_id") REFERENCES "public"."mitigation_options"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_actions" ADD CONSTRAINT "capital_actions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_actions" ADD CONSTRAINT "capital_actions_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_actions" ADD CONSTRAINT "capital_actions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_evaluation_sites" ADD CONSTRAINT "capital_evaluation_sites_evaluation_id_capital_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."capital_evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_evaluations" ADD CONSTRAINT "capital_evaluations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_evaluations" ADD CONSTRAINT "capital_evaluations_assumption_version_id_assumption_set_versions_id_fk" FOREIGN KEY ("assumption_version_id") REFERENCES "public"."assumption_set_versions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_evaluations" ADD CONSTRAINT "capital_evaluations_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_plans" ADD CONSTRAINT "capital_plans_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_plans" ADD CONSTRAINT "capital_plans_evaluation_id_capital_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."capital_evaluations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_plans" ADD CONSTRAINT "capital_plans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capital_scenario_results" ADD CONSTRAINT "capital_scenario_results_evaluation_id_capital_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."capital_evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_options" ADD CONSTRAINT "mitigation_options_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "capital_actions_org_idx" ON "capital_actions" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "capital_actions_site_idx" ON "capital_actions" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "capital_actions_option_idx" ON "capital_actions" USING btree ("option_id");--> statement-breakpoint
CREATE UNIQUE INDEX "capital_actions_option_tank_unique" ON "capital_actions" USING btree ("option_id","tank_id");--> statement-breakpoint
CREATE INDEX "capital_evaluations_org_idx" ON "capital_evaluations" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "capital_evaluations_version_idx" ON "capital_evaluations" USING btree ("assumption_version_id");--> statement-breakpoint
CREATE INDEX "capital_evaluations_plan_idx" ON "capital_evaluations" USING btree ("plan_id");--> statement-breakpoint
CREATE UNIQUE INDEX "capital_plans_org_name_unique" ON "capital_plans" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "capital_plans_evaluation_idx" ON "capital_plans" USING btree ("evaluation_id");--> statement-breakpoint
CREATE INDEX "capital_scenario_results_site_idx" ON "capital_scenario_results" USING btree ("evaluation_id","site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mitigation_options_org_name_unique" ON "mitigation_options" USING btree ("organisation_id","name");