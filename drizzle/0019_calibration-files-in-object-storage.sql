ALTER TABLE "calibration_files" ALTER COLUMN "content_gzip" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD COLUMN "content_key" text;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD COLUMN "content_size" bigint;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD COLUMN "content_sha256" text;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD CONSTRAINT "calibration_files_content_kept" CHECK ("calibration_files"."content_key" IS NOT NULL OR "calibration_files"."content_gzip" IS NOT NULL);