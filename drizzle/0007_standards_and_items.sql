CREATE TABLE "customer_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"customer_id" uuid NOT NULL,
	"description" text NOT NULL,
	"maker" text DEFAULT '' NOT NULL,
	"model" text DEFAULT '' NOT NULL,
	"serial_number" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reference_standard_values" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"standard_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"quantity" text NOT NULL,
	"value" double precision NOT NULL,
	"unit" text NOT NULL,
	"expanded_uncertainty" double precision NOT NULL,
	"coverage_factor" double precision NOT NULL,
	"at_value" double precision,
	"at_unit" text,
	CONSTRAINT "reference_standard_values_u_check" CHECK ("reference_standard_values"."expanded_uncertainty" >= 0 AND "reference_standard_values"."coverage_factor" > 0)
);
--> statement-breakpoint
CREATE TABLE "reference_standards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"serial_number" text NOT NULL,
	"certificate_number" text NOT NULL,
	"issuing_laboratory" text NOT NULL,
	"calibration_date" date NOT NULL,
	"due_date" date NOT NULL,
	"status" text DEFAULT 'in_service' NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"certificate_file_sha256" text,
	"certificate_file_name" text,
	"certificate_file_size" integer,
	"certificate_file_uploaded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reference_standards_kind_check" CHECK ("reference_standards"."kind" IN ('blackbody_source', 'reference_thermometer', 'transfer_radiation_thermometer', 'spectroradiometer', 'other')),
	CONSTRAINT "reference_standards_status_check" CHECK ("reference_standards"."status" IN ('in_service', 'out_of_service', 'withdrawn')),
	CONSTRAINT "reference_standards_dates_check" CHECK ("reference_standards"."due_date" >= "reference_standards"."calibration_date")
);
--> statement-breakpoint
ALTER TABLE "customer_items" ADD CONSTRAINT "customer_items_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_standard_values" ADD CONSTRAINT "reference_standard_values_standard_id_reference_standards_id_fk" FOREIGN KEY ("standard_id") REFERENCES "public"."reference_standards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "customer_items_customer_idx" ON "customer_items" USING btree ("customer_id");--> statement-breakpoint
CREATE UNIQUE INDEX "customer_items_identity_unique" ON "customer_items" USING btree ("customer_id","maker","model","serial_number");--> statement-breakpoint
CREATE INDEX "reference_standard_values_standard_idx" ON "reference_standard_values" USING btree ("standard_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "reference_standards_name_unique" ON "reference_standards" USING btree (lower("name"));--> statement-breakpoint
CREATE INDEX "reference_standards_due_idx" ON "reference_standards" USING btree ("due_date");