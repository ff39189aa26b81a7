CREATE TYPE "public"."referral_status" AS ENUM('open', 'in_review', 'accepted', 'declined');--> statement-breakpoint
CREATE TABLE "site_note_replies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"note_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"author_id" uuid,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "site_notes" ADD COLUMN "status" "referral_status" DEFAULT 'open' NOT NULL;--> statement-breakpoint
ALTER TABLE "site_notes" ADD COLUMN "assignee_id" uuid;--> statement-breakpoint
ALTER TABLE "site_notes" ADD COLUMN "due_on" date;--> statement-breakpoint
ALTER TABLE "site_notes" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "site_note_replies" ADD CONSTRAINT "site_note_replies_note_id_site_notes_id_fk" FOREIGN KEY ("note_id") REFERENCES "public"."site_notes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_note_replies" ADD CONSTRAINT "site_note_replies_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_note_replies" ADD CONSTRAINT "site_note_replies_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_note_replies_note_idx" ON "site_note_replies" USING btree ("note_id","created_at");--> statement-breakpoint
CREATE INDEX "site_note_replies_org_idx" ON "site_note_replies" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "site_note_replies_author_idx" ON "site_note_replies" USING btree ("author_id");--> statement-breakpoint
ALTER TABLE "site_notes" ADD CONSTRAINT "site_notes_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_notes_assignee_idx" ON "site_notes" USING btree ("assignee_id");--> statement-breakpoint
CREATE INDEX "site_notes_org_status_idx" ON "site_notes" USING btree ("organisation_id","status");--> statement-breakpoint
-- hand-written: backfill
-- Notes written before referrals had a status: open, last changed when they were written.
UPDATE "site_notes" SET "updated_at" = "created_at";
