CREATE TABLE "storm_feed_attempts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"feed_id" uuid NOT NULL,
	"attempted_at" timestamp (3) with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "storm_site_results" (
	"window_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"loss_model" jsonb NOT NULL,
	"expected_ground_up_loss" numeric(20, 2) NOT NULL,
	CONSTRAINT "storm_site_results_window_id_site_id_pk" PRIMARY KEY("window_id","site_id")
);
--> statement-breakpoint
ALTER TABLE "storm_feed_attempts" ADD CONSTRAINT "storm_feed_attempts_feed_id_storm_feeds_id_fk" FOREIGN KEY ("feed_id") REFERENCES "public"."storm_feeds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_site_results" ADD CONSTRAINT "storm_site_results_window_id_storm_windows_id_fk" FOREIGN KEY ("window_id") REFERENCES "public"."storm_windows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "storm_site_results" ADD CONSTRAINT "storm_site_results_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "storm_feed_attempts_feed_at_idx" ON "storm_feed_attempts" USING btree ("feed_id","attempted_at");--> statement-breakpoint
CREATE INDEX "storm_site_results_site_idx" ON "storm_site_results" USING btree ("site_id");