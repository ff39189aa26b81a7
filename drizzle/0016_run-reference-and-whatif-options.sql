CREATE TABLE "whatif_options" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"run_id" uuid,
	"site_id" uuid,
	"tank_id" uuid,
	"tank_tag" text,
	"label" text NOT NULL,
	"params" jsonb NOT NULL,
	"changes" jsonb NOT NULL,
	"figures" jsonb NOT NULL,
	"baseline_figures" jsonb,
	"engine_version" text NOT NULL,
	"mast_x_m" double precision,
	"mast_y_m" double precision,
	"capital_action_id" uuid,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "name" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "is_reference" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "whatif_options" ADD CONSTRAINT "whatif_options_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "whatif_options" ADD CONSTRAINT "whatif_options_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "whatif_options" ADD CONSTRAINT "whatif_options_capital_action_id_capital_actions_id_fk" FOREIGN KEY ("capital_action_id") REFERENCES "public"."capital_actions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "whatif_options" ADD CONSTRAINT "whatif_options_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "whatif_options_org_run_idx" ON "whatif_options" USING btree ("organisation_id","run_id","site_id");--> statement-breakpoint
CREATE INDEX "whatif_options_run_idx" ON "whatif_options" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "whatif_options_action_idx" ON "whatif_options" USING btree ("capital_action_id");--> statement-breakpoint
CREATE INDEX "whatif_options_created_by_idx" ON "whatif_options" USING btree ("created_by");--> statement-breakpoint
CREATE UNIQUE INDEX "runs_one_reference_per_portfolio" ON "runs" USING btree ("organisation_id","portfolio_id") WHERE "runs"."is_reference";--> statement-breakpoint
-- hand-written: backfill
-- Runs made before names: the portfolio's name and the UTC day the run was created (as new runs get).
UPDATE "runs" SET "name" = "portfolio_name" || ', ' || to_char("created_at" AT TIME ZONE 'UTC', 'YYYY-MM-DD') WHERE "name" = '';--> statement-breakpoint
-- Each portfolio's newest succeeded run becomes its reference run.
UPDATE "runs" SET "is_reference" = true WHERE "id" IN (
  SELECT DISTINCT ON ("organisation_id", "portfolio_id") "id" FROM "runs"
  WHERE "state" = 'succeeded'
  ORDER BY "organisation_id", "portfolio_id", "finished_at" DESC NULLS LAST, "created_at" DESC, "id"
);
