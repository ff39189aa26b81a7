ALTER TABLE "runs" ADD COLUMN "storm_clustering" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "clustering_frame" jsonb;-- hand-written: backfill
-- Runs started before the option simulated independent years: the column default (false) records exactly that, and they keep no frame.
