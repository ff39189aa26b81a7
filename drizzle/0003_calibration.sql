CREATE TYPE "public"."calibration_kind" AS ENUM('lightning', 'impulse');--> statement-breakpoint
CREATE TYPE "public"."calibration_target" AS ENUM('assumption_version', 'site_flash_density');--> statement-breakpoint
CREATE TABLE "calibration_applications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"calibration_id" uuid NOT NULL,
	"target" "calibration_target" NOT NULL,
	"assumption_version_id" uuid,
	"values" jsonb NOT NULL,
	"applied_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibration_applications_version_when_needed" CHECK (("calibration_applications"."target" = 'assumption_version') = ("calibration_applications"."assumption_version_id" IS NOT NULL))
);
--> statement-breakpoint
CREATE TABLE "calibration_files" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"kind" "calibration_kind" NOT NULL,
	"file_name" text NOT NULL,
	"byte_size" bigint NOT NULL,
	"row_count" integer NOT NULL,
	"sha256" text NOT NULL,
	"content_gzip" "bytea" NOT NULL,
	"summary" jsonb NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibration_files_name_present" CHECK (length("calibration_files"."file_name") > 0),
	CONSTRAINT "calibration_files_sizes" CHECK ("calibration_files"."byte_size" >= 0 AND "calibration_files"."row_count" >= 0)
);
--> statement-breakpoint
CREATE TABLE "calibrations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"kind" "calibration_kind" NOT NULL,
	"title" text NOT NULL,
	"file_id" uuid NOT NULL,
	"inputs" jsonb NOT NULL,
	"results" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibrations_title_present" CHECK (length("calibrations"."title") > 0)
);
--> statement-breakpoint
ALTER TABLE "calibration_applications" ADD CONSTRAINT "calibration_applications_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_applications" ADD CONSTRAINT "calibration_applications_calibration_id_calibrations_id_fk" FOREIGN KEY ("calibration_id") REFERENCES "public"."calibrations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_applications" ADD CONSTRAINT "calibration_applications_applied_by_users_id_fk" FOREIGN KEY ("applied_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD CONSTRAINT "calibration_files_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibration_files" ADD CONSTRAINT "calibration_files_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_file_id_calibration_files_id_fk" FOREIGN KEY ("file_id") REFERENCES "public"."calibration_files"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calibration_applications_calibration_idx" ON "calibration_applications" USING btree ("calibration_id");--> statement-breakpoint
CREATE INDEX "calibration_applications_org_idx" ON "calibration_applications" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "calibration_applications_applied_by_idx" ON "calibration_applications" USING btree ("applied_by");--> statement-breakpoint
CREATE INDEX "calibration_applications_version_idx" ON "calibration_applications" USING btree ("assumption_version_id");--> statement-breakpoint
CREATE INDEX "calibration_files_org_created_idx" ON "calibration_files" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "calibration_files_uploaded_by_idx" ON "calibration_files" USING btree ("uploaded_by");--> statement-breakpoint
CREATE INDEX "calibrations_org_created_idx" ON "calibrations" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "calibrations_file_idx" ON "calibrations" USING btree ("file_id");--> statement-breakpoint
CREATE INDEX "calibrations_created_by_idx" ON "calibrations" USING btree ("created_by");