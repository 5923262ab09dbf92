CREATE TABLE "task_runs" (
	"id" uuid PRIMARY KEY NOT NULL,
	"kind" text NOT NULL,
	"subject" text,
	"owner_id" text,
	"state" text DEFAULT 'queued' NOT NULL,
	"progress_done" double precision DEFAULT 0 NOT NULL,
	"progress_target" double precision DEFAULT 0 NOT NULL,
	"result" jsonb,
	"error_code" text,
	"error_message" text,
	"cancel_requested" boolean DEFAULT false NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"completions" integer DEFAULT 0 NOT NULL,
	"started_by" text,
	"finished_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"elapsed_ms" integer
);
--> statement-breakpoint
CREATE INDEX "task_runs_subject_idx" ON "task_runs" USING btree ("kind","subject","state");