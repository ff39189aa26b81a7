ALTER TABLE "run_portfolio_results" ADD COLUMN "direct_count" bigint;--> statement-breakpoint
ALTER TABLE "run_portfolio_results" ADD COLUMN "sparking_count" bigint;--> statement-breakpoint
ALTER TABLE "run_portfolio_results" ADD COLUMN "ignition_count" bigint;--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "direct_count" bigint;--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "sparking_count" bigint;--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "ignition_count" bigint;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "direct_count" bigint;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "sparking_count" bigint;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "ignition_count" bigint;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "upper_bound_figures" text[] DEFAULT '{}'::text[] NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "negligible_rate_per_year" double precision DEFAULT 0.00001 NOT NULL;--> statement-breakpoint
-- hand-written: backfill
-- Year-mode runs finished before counts were stored: the count is the stored rate times the run's years (whole by construction).
UPDATE "run_tank_results" AS t SET "direct_count" = round(t."direct_rate" * r."years"), "sparking_count" = round(t."sparking_rate" * r."years"), "ignition_count" = round(t."ignition_rate" * r."years") FROM "runs" AS r WHERE r."id" = t."run_id" AND r."mode" = 'year';--> statement-breakpoint
UPDATE "run_site_results" AS t SET "direct_count" = round(t."direct_rate" * r."years"), "sparking_count" = round(t."sparking_rate" * r."years"), "ignition_count" = round(t."ignition_rate" * r."years") FROM "runs" AS r WHERE r."id" = t."run_id" AND r."mode" = 'year';--> statement-breakpoint
UPDATE "run_portfolio_results" AS t SET "direct_count" = round(t."direct_rate" * r."years"), "sparking_count" = round(t."sparking_rate" * r."years"), "ignition_count" = round(t."ignition_rate" * r."years") FROM "runs" AS r WHERE r."id" = t."run_id" AND r."mode" = 'year';
