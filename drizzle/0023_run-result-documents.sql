CREATE TABLE "run_result_documents" (
	"run_id" uuid NOT NULL,
	"view" text NOT NULL,
	"currency" text NOT NULL,
	"version" text NOT NULL,
	"body" text NOT NULL,
	"built_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_result_documents_run_id_view_currency_pk" PRIMARY KEY("run_id","view","currency")
);
--> statement-breakpoint
ALTER TABLE "run_result_documents" ADD CONSTRAINT "run_result_documents_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;