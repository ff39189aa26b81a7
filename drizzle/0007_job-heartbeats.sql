CREATE TABLE "job_heartbeats" (
	"job_id" uuid PRIMARY KEY NOT NULL,
	"queue" text NOT NULL,
	"worker" text NOT NULL,
	"beat_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE INDEX "job_heartbeats_beat_at_idx" ON "job_heartbeats" USING btree ("beat_at");