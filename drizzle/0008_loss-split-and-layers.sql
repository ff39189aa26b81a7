CREATE TYPE "public"."policy_layer_kind" AS ENUM('occurrence', 'aggregate');--> statement-breakpoint
CREATE TABLE "policy_layers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"version_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"name" text NOT NULL,
	"kind" "policy_layer_kind" NOT NULL,
	"attachment" numeric(16, 2) NOT NULL,
	"limit" numeric(16, 2),
	CONSTRAINT "policy_layers_attachment_nonnegative" CHECK ("policy_layers"."attachment" >= 0),
	CONSTRAINT "policy_layers_limit_positive" CHECK (coalesce("policy_layers"."limit", 1) > 0)
);
--> statement-breakpoint
ALTER TABLE "run_portfolio_results" ADD COLUMN "expected_annual_loss_pd" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "run_portfolio_results" ADD COLUMN "expected_annual_loss_bi" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "expected_annual_loss_pd" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "expected_annual_loss_bi" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "expected_annual_loss_pd" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "expected_annual_loss_bi" numeric(20, 2);--> statement-breakpoint
ALTER TABLE "policy_site_terms" ADD COLUMN "interruption_deductible" numeric(16, 2) DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "policy_layers" ADD CONSTRAINT "policy_layers_version_id_policy_terms_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."policy_terms_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "policy_layers_version_position_unique" ON "policy_layers" USING btree ("version_id","position");--> statement-breakpoint
ALTER TABLE "policy_site_terms" ADD CONSTRAINT "policy_site_terms_interruption_deductible_nonnegative" CHECK ("policy_site_terms"."interruption_deductible" >= 0);