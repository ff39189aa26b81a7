CREATE TABLE "policy_site_terms" (
	"version_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"occurrence_deductible" numeric(16, 2) DEFAULT 0 NOT NULL,
	"occurrence_limit" numeric(16, 2),
	"aggregate_deductible" numeric(16, 2) DEFAULT 0 NOT NULL,
	"aggregate_limit" numeric(16, 2),
	"share" numeric(7, 6) DEFAULT 1 NOT NULL,
	CONSTRAINT "policy_site_terms_version_id_site_id_pk" PRIMARY KEY("version_id","site_id"),
	CONSTRAINT "policy_site_terms_deductibles_nonnegative" CHECK ("policy_site_terms"."occurrence_deductible" >= 0 AND "policy_site_terms"."aggregate_deductible" >= 0),
	CONSTRAINT "policy_site_terms_limits_positive" CHECK (coalesce("policy_site_terms"."occurrence_limit", 1) > 0 AND coalesce("policy_site_terms"."aggregate_limit", 1) > 0),
	CONSTRAINT "policy_site_terms_share_range" CHECK ("policy_site_terms"."share" BETWEEN 0 AND 1)
);
--> statement-breakpoint
CREATE TABLE "policy_terms_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"portfolio_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "policy_terms_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"terms_set_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"used_by_run" boolean DEFAULT false NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "run_terms" (
	"run_id" uuid PRIMARY KEY NOT NULL,
	"terms_version_id" uuid NOT NULL
);
--> statement-breakpoint
ALTER TABLE "policy_site_terms" ADD CONSTRAINT "policy_site_terms_version_id_policy_terms_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."policy_terms_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD CONSTRAINT "policy_terms_sets_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "policy_terms_sets" ADD CONSTRAINT "policy_terms_sets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "policy_terms_versions" ADD CONSTRAINT "policy_terms_versions_terms_set_id_policy_terms_sets_id_fk" FOREIGN KEY ("terms_set_id") REFERENCES "public"."policy_terms_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "policy_terms_versions" ADD CONSTRAINT "policy_terms_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_terms" ADD CONSTRAINT "run_terms_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_terms" ADD CONSTRAINT "run_terms_terms_version_id_policy_terms_versions_id_fk" FOREIGN KEY ("terms_version_id") REFERENCES "public"."policy_terms_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "policy_site_terms_site_idx" ON "policy_site_terms" USING btree ("site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "policy_terms_sets_org_portfolio_unique" ON "policy_terms_sets" USING btree ("organisation_id","portfolio_id");--> statement-breakpoint
CREATE INDEX "policy_terms_sets_portfolio_idx" ON "policy_terms_sets" USING btree ("portfolio_id");--> statement-breakpoint
CREATE UNIQUE INDEX "policy_terms_versions_set_version_unique" ON "policy_terms_versions" USING btree ("terms_set_id","version");--> statement-breakpoint
CREATE INDEX "run_terms_version_idx" ON "run_terms" USING btree ("terms_version_id");