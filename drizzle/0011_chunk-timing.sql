ALTER TABLE "run_chunks" ADD COLUMN "timing" jsonb;--> statement-breakpoint
-- hand-written: backfill
-- Chunks stored before the timing was measured carry an empty record ("not measured").
UPDATE "run_chunks" SET "timing" = '{}'::jsonb WHERE "timing" IS NULL AND "state" = 'done';
