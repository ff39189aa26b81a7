CREATE TYPE "public"."component_class" AS ENUM('sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre');--> statement-breakpoint
CREATE TYPE "public"."inventory_import_status" AS ENUM('previewed', 'committed', 'rejected');--> statement-breakpoint
CREATE TYPE "public"."structure_kind" AS ENUM('mast', 'stack', 'ogw_support', 'building');--> statement-breakpoint
CREATE TYPE "public"."tank_contents" AS ENUM('crude', 'condensate', 'produced_water', 'fresh_water', 'chemical');--> statement-breakpoint
CREATE TYPE "public"."tank_grounding" AS ENUM('none', 'single', 'multiple');--> statement-breakpoint
CREATE TYPE "public"."tank_material" AS ENUM('frp', 'polyethylene', 'steel', 'other');--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"email" text NOT NULL,
	"role" "member_role" NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by_id" uuid,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"accepted_by_id" uuid,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "password_reset_tokens" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_in_attempts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"ip_address" text NOT NULL,
	"succeeded" boolean NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "inventory_imports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"uploaded_by" uuid,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"file_data" "bytea" NOT NULL,
	"status" "inventory_import_status" NOT NULL,
	"summary" jsonb NOT NULL,
	"errors" jsonb NOT NULL,
	"committed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "inventory_imports_size" CHECK ("inventory_imports"."size_bytes" >= 0)
);
--> statement-breakpoint
CREATE TABLE "portfolio_shares" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"portfolio_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"granted_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "portfolio_sites" (
	"portfolio_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"added_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "portfolio_sites_portfolio_id_site_id_pk" PRIMARY KEY("portfolio_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "portfolios" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site_structures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"external_id" text NOT NULL,
	"kind" "structure_kind" NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"x_m" double precision NOT NULL,
	"y_m" double precision NOT NULL,
	"height_m" double precision NOT NULL,
	"radius_m" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_structures_height_positive" CHECK ("site_structures"."height_m" > 0 AND "site_structures"."height_m" <= 500),
	CONSTRAINT "site_structures_radius_positive" CHECK ("site_structures"."radius_m" > 0 AND "site_structures"."radius_m" <= 200),
	CONSTRAINT "site_structures_position_range" CHECK (abs("site_structures"."x_m") <= 5000 AND abs("site_structures"."y_m") <= 5000)
);
--> statement-breakpoint
CREATE TABLE "sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"external_id" text NOT NULL,
	"name" text NOT NULL,
	"operator_name" text DEFAULT '' NOT NULL,
	"latitude_deg" double precision NOT NULL,
	"longitude_deg" double precision NOT NULL,
	"flash_density_per_km2_yr" double precision,
	"thunderstorm_days_per_yr" double precision,
	"location_notes" text DEFAULT '' NOT NULL,
	"insured_property_value" numeric(14, 2),
	"insured_interruption_value" numeric(14, 2),
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sites_latitude_range" CHECK ("sites"."latitude_deg" BETWEEN -90 AND 90),
	CONSTRAINT "sites_longitude_range" CHECK ("sites"."longitude_deg" BETWEEN -180 AND 180),
	CONSTRAINT "sites_one_flash_source" CHECK (("sites"."flash_density_per_km2_yr" IS NULL) <> ("sites"."thunderstorm_days_per_yr" IS NULL)),
	CONSTRAINT "sites_flash_density_range" CHECK ("sites"."flash_density_per_km2_yr" IS NULL OR ("sites"."flash_density_per_km2_yr" > 0 AND "sites"."flash_density_per_km2_yr" <= 100)),
	CONSTRAINT "sites_thunderstorm_days_range" CHECK ("sites"."thunderstorm_days_per_yr" IS NULL OR ("sites"."thunderstorm_days_per_yr" > 0 AND "sites"."thunderstorm_days_per_yr" <= 366)),
	CONSTRAINT "sites_insured_values_nonnegative" CHECK (coalesce("sites"."insured_property_value", 0) >= 0 AND coalesce("sites"."insured_interruption_value", 0) >= 0)
);
--> statement-breakpoint
CREATE TABLE "tank_components" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"tank_id" uuid NOT NULL,
	"component_class" "component_class" NOT NULL,
	"count" integer NOT NULL,
	"height_m" double precision NOT NULL,
	CONSTRAINT "tank_components_count_positive" CHECK ("tank_components"."count" > 0 AND "tank_components"."count" <= 1000),
	CONSTRAINT "tank_components_height_positive" CHECK ("tank_components"."height_m" > 0 AND "tank_components"."height_m" <= 100)
);
--> statement-breakpoint
CREATE TABLE "tanks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"external_id" text NOT NULL,
	"tag" text NOT NULL,
	"material" "tank_material" NOT NULL,
	"height_m" double precision NOT NULL,
	"diameter_m" double precision NOT NULL,
	"x_m" double precision NOT NULL,
	"y_m" double precision NOT NULL,
	"contents" "tank_contents" NOT NULL,
	"flammable_vapour_space" boolean NOT NULL,
	"chemical_flash_point_c" double precision,
	"grounding" "tank_grounding" DEFAULT 'single' NOT NULL,
	"shield_rating_ka" double precision,
	"vapour_control" boolean DEFAULT false NOT NULL,
	"static_dissipator" boolean DEFAULT false NOT NULL,
	"bonding_upgrade" boolean DEFAULT false NOT NULL,
	"replacement_value" numeric(14, 2) DEFAULT 0 NOT NULL,
	"contents_value" numeric(14, 2) DEFAULT 0 NOT NULL,
	"cleanup_cost" numeric(14, 2) DEFAULT 0 NOT NULL,
	"interruption_cost" numeric(14, 2) DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tanks_height_positive" CHECK ("tanks"."height_m" > 0 AND "tanks"."height_m" <= 100),
	CONSTRAINT "tanks_diameter_positive" CHECK ("tanks"."diameter_m" > 0 AND "tanks"."diameter_m" <= 200),
	CONSTRAINT "tanks_position_range" CHECK (abs("tanks"."x_m") <= 5000 AND abs("tanks"."y_m") <= 5000),
	CONSTRAINT "tanks_shield_positive" CHECK ("tanks"."shield_rating_ka" IS NULL OR ("tanks"."shield_rating_ka" > 0 AND "tanks"."shield_rating_ka" <= 500)),
	CONSTRAINT "tanks_flash_point_range" CHECK ("tanks"."chemical_flash_point_c" IS NULL OR "tanks"."chemical_flash_point_c" BETWEEN -100 AND 400),
	CONSTRAINT "tanks_money_nonnegative" CHECK ("tanks"."replacement_value" >= 0 AND "tanks"."contents_value" >= 0 AND "tanks"."cleanup_cost" >= 0 AND "tanks"."interruption_cost" >= 0)
);
--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "last_organisation_id" uuid;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_id_users_id_fk" FOREIGN KEY ("invited_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_accepted_by_id_users_id_fk" FOREIGN KEY ("accepted_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "password_reset_tokens" ADD CONSTRAINT "password_reset_tokens_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD CONSTRAINT "inventory_imports_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inventory_imports" ADD CONSTRAINT "inventory_imports_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolio_shares" ADD CONSTRAINT "portfolio_shares_portfolio_id_portfolios_id_fk" FOREIGN KEY ("portfolio_id") REFERENCES "public"."portfolios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolio_shares" ADD CONSTRAINT "portfolio_shares_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolio_shares" ADD CONSTRAINT "portfolio_shares_granted_by_users_id_fk" FOREIGN KEY ("granted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolio_sites" ADD CONSTRAINT "portfolio_sites_portfolio_id_portfolios_id_fk" FOREIGN KEY ("portfolio_id") REFERENCES "public"."portfolios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolio_sites" ADD CONSTRAINT "portfolio_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "portfolios" ADD CONSTRAINT "portfolios_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_structures" ADD CONSTRAINT "site_structures_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tank_components" ADD CONSTRAINT "tank_components_tank_id_tanks_id_fk" FOREIGN KEY ("tank_id") REFERENCES "public"."tanks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tanks" ADD CONSTRAINT "tanks_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "invitations_token_hash_unique" ON "invitations" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "invitations_org_idx" ON "invitations" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "invitations_email_idx" ON "invitations" USING btree ("email");--> statement-breakpoint
CREATE INDEX "invitations_invited_by_idx" ON "invitations" USING btree ("invited_by_id");--> statement-breakpoint
CREATE INDEX "invitations_accepted_by_idx" ON "invitations" USING btree ("accepted_by_id");--> statement-breakpoint
CREATE UNIQUE INDEX "password_reset_tokens_hash_unique" ON "password_reset_tokens" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "password_reset_tokens_user_idx" ON "password_reset_tokens" USING btree ("user_id","created_at");--> statement-breakpoint
CREATE INDEX "sign_in_attempts_email_idx" ON "sign_in_attempts" USING btree ("email","at");--> statement-breakpoint
CREATE INDEX "sign_in_attempts_ip_idx" ON "sign_in_attempts" USING btree ("ip_address","at");--> statement-breakpoint
CREATE INDEX "inventory_imports_org_idx" ON "inventory_imports" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "inventory_imports_uploaded_by_idx" ON "inventory_imports" USING btree ("uploaded_by");--> statement-breakpoint
CREATE INDEX "inventory_imports_status_idx" ON "inventory_imports" USING btree ("status");--> statement-breakpoint
CREATE UNIQUE INDEX "portfolio_shares_unique" ON "portfolio_shares" USING btree ("portfolio_id","organisation_id");--> statement-breakpoint
CREATE INDEX "portfolio_shares_org_idx" ON "portfolio_shares" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "portfolio_shares_granted_by_idx" ON "portfolio_shares" USING btree ("granted_by");--> statement-breakpoint
CREATE INDEX "portfolio_sites_site_idx" ON "portfolio_sites" USING btree ("site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "portfolios_org_name_unique" ON "portfolios" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "site_structures_site_idx" ON "site_structures" USING btree ("site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "site_structures_site_external_id_unique" ON "site_structures" USING btree ("site_id","external_id");--> statement-breakpoint
CREATE UNIQUE INDEX "sites_org_external_id_unique" ON "sites" USING btree ("organisation_id","external_id");--> statement-breakpoint
CREATE INDEX "sites_org_name_idx" ON "sites" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "sites_org_operator_idx" ON "sites" USING btree ("organisation_id","operator_name");--> statement-breakpoint
CREATE UNIQUE INDEX "tank_components_tank_class_unique" ON "tank_components" USING btree ("tank_id","component_class");--> statement-breakpoint
CREATE INDEX "tanks_site_idx" ON "tanks" USING btree ("site_id");--> statement-breakpoint
CREATE UNIQUE INDEX "tanks_site_external_id_unique" ON "tanks" USING btree ("site_id","external_id");--> statement-breakpoint
CREATE UNIQUE INDEX "tanks_site_tag_unique" ON "tanks" USING btree ("site_id","tag");--> statement-breakpoint
CREATE INDEX "tanks_material_idx" ON "tanks" USING btree ("material");--> statement-breakpoint
CREATE INDEX "tanks_contents_idx" ON "tanks" USING btree ("contents");--> statement-breakpoint
ALTER TABLE "users" ADD CONSTRAINT "users_last_organisation_id_organisations_id_fk" FOREIGN KEY ("last_organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "users_last_organisation_idx" ON "users" USING btree ("last_organisation_id");