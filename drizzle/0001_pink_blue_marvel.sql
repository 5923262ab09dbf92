CREATE SEQUENCE "public"."job_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "calibration_points" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"nominal_value" double precision NOT NULL,
	"nominal_unit" text NOT NULL,
	"inputs" jsonb NOT NULL,
	"correlations" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"outside_scope" boolean DEFAULT false NOT NULL,
	"outside_scope_reason" text,
	"result" jsonb,
	"result_engine_version" text,
	"result_seed" bigint,
	"computed_at" timestamp with time zone,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"customer_id" uuid NOT NULL,
	"item_id" uuid NOT NULL,
	"template_version_id" uuid NOT NULL,
	"received_on" date,
	"calibrated_on" date,
	"location" text DEFAULT '' NOT NULL,
	"environment" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"review_comment" text,
	"rejected_at" timestamp with time zone,
	"submitted_at" timestamp with time zone,
	"analyst_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "jobs_status_check" CHECK ("jobs"."status" in ('draft', 'submitted', 'approved', 'issued'))
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"symbol" text NOT NULL,
	"values" jsonb NOT NULL,
	"file_name" text,
	"sha256" text,
	"column" text,
	"uploaded_by" uuid NOT NULL,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "calibration_points" ADD CONSTRAINT "calibration_points_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_analyst_id_user_id_fk" FOREIGN KEY ("analyst_id") REFERENCES "public"."user"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_point_id_calibration_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."calibration_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calibration_points_job_idx" ON "calibration_points" USING btree ("job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "jobs_number_idx" ON "jobs" USING btree ("number");--> statement-breakpoint
CREATE INDEX "jobs_status_idx" ON "jobs" USING btree ("status");--> statement-breakpoint
CREATE INDEX "jobs_customer_idx" ON "jobs" USING btree ("customer_id");--> statement-breakpoint
CREATE UNIQUE INDEX "readings_point_symbol_idx" ON "readings" USING btree ("point_id","symbol");