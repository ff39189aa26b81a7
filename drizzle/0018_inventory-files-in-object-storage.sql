ALTER TABLE "inventory_imports" ALTER COLUMN "file_data" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "file_key" text;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "file_sha256" text;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD CONSTRAINT "inventory_imports_file_kept" CHECK ("inventory_imports"."file_key" IS NOT NULL OR "inventory_imports"."file_data" IS NOT NULL);