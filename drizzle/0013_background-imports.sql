ALTER TYPE "public"."inventory_import_status" ADD VALUE 'committing' BEFORE 'committed';--> statement-breakpoint
ALTER TYPE "public"."inventory_import_status" ADD VALUE 'failed' BEFORE 'rejected';--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "committed_by" uuid;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "commit_portfolio_id" uuid;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "progress" jsonb;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD COLUMN "failure_message" text;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD CONSTRAINT "inventory_imports_committed_by_users_id_fk" FOREIGN KEY ("committed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD CONSTRAINT "inventory_imports_commit_portfolio_id_portfolios_id_fk" FOREIGN KEY ("commit_portfolio_id") REFERENCES "public"."portfolios"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "inventory_imports_committed_by_idx" ON "inventory_imports" USING btree ("committed_by");--> statement-breakpoint
CREATE INDEX "inventory_imports_commit_portfolio_idx" ON "inventory_imports" USING btree ("commit_portfolio_id");--> statement-breakpoint
-- hand-written: backfill
-- Imports committed before background commits: every row of the file was checked and written.
UPDATE "inventory_imports" SET "progress" = jsonb_build_object(
  'rowsTotal', ("summary"->>'rows')::int, 'rowsChecked', ("summary"->>'rows')::int,
  'rowsToWrite', w.n, 'rowsWritten', w.n)
FROM (SELECT "id", coalesce(("summary"#>>'{sites,new}')::int, 0) + coalesce(("summary"#>>'{sites,changed}')::int, 0)
  + coalesce(("summary"#>>'{tanks,new}')::int, 0) + coalesce(("summary"#>>'{tanks,changed}')::int, 0)
  + coalesce(("summary"#>>'{structures,new}')::int, 0) + coalesce(("summary"#>>'{structures,changed}')::int, 0) AS n
  FROM "inventory_imports") AS w
WHERE w."id" = "inventory_imports"."id" AND "inventory_imports"."status" = 'committed' AND "inventory_imports"."progress" IS NULL;
