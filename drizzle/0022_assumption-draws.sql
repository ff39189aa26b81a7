ALTER TABLE "run_portfolio_results" ADD COLUMN "draws" jsonb;--> statement-breakpoint
ALTER TABLE "run_site_results" ADD COLUMN "draws" jsonb;--> statement-breakpoint
ALTER TABLE "run_tank_results" ADD COLUMN "draws" jsonb;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "assumption_draws" integer DEFAULT 0 NOT NULL;