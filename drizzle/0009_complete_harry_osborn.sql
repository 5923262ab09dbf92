CREATE SEQUENCE "public"."certificate_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "certificate_amendments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"certificate_id" uuid NOT NULL,
	"new_job_id" uuid NOT NULL,
	"reason" text NOT NULL,
	"opened_by" uuid NOT NULL,
	"opened_at" timestamp with time zone NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"new_certificate_id" uuid,
	CONSTRAINT "certificate_amendments_status_check" CHECK ("certificate_amendments"."status" IN ('open', 'issued'))
);
--> statement-breakpoint
CREATE TABLE "certificate_mails" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"certificate_id" uuid NOT NULL,
	"outbox_id" uuid NOT NULL,
	"recipient" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "certificates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"job_id" uuid,
	"customer_id" uuid NOT NULL,
	"data" jsonb NOT NULL,
	"pdf" "bytea" NOT NULL,
	"pdf_sha256" text NOT NULL,
	"pdf_size" integer NOT NULL,
	"signing_fingerprint" text NOT NULL,
	"issued_at" timestamp with time zone NOT NULL,
	"signatory_id" uuid,
	"signatory_name" text NOT NULL,
	"amends_id" uuid,
	"amend_reason" text,
	"status" text DEFAULT 'current' NOT NULL,
	"superseded_by_id" uuid,
	"superseded_at" timestamp with time zone,
	"withdrawn_at" timestamp with time zone,
	"withdrawn_reason" text,
	CONSTRAINT "certificates_status_check" CHECK ("certificates"."status" IN ('current', 'superseded', 'withdrawn')),
	CONSTRAINT "certificates_superseded_check" CHECK (("certificates"."status" = 'superseded') = ("certificates"."superseded_by_id" IS NOT NULL))
);
--> statement-breakpoint
CREATE TABLE "review_settings" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"forbid_self_approval" boolean DEFAULT true NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "review_settings_single_row" CHECK ("review_settings"."id" = 1)
);
--> statement-breakpoint
ALTER TABLE "certificate_amendments" ADD CONSTRAINT "certificate_amendments_certificate_id_certificates_id_fk" FOREIGN KEY ("certificate_id") REFERENCES "public"."certificates"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificate_amendments" ADD CONSTRAINT "certificate_amendments_new_job_id_jobs_id_fk" FOREIGN KEY ("new_job_id") REFERENCES "public"."jobs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificate_amendments" ADD CONSTRAINT "certificate_amendments_opened_by_user_id_fk" FOREIGN KEY ("opened_by") REFERENCES "public"."user"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificate_amendments" ADD CONSTRAINT "certificate_amendments_new_certificate_id_certificates_id_fk" FOREIGN KEY ("new_certificate_id") REFERENCES "public"."certificates"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificate_mails" ADD CONSTRAINT "certificate_mails_certificate_id_certificates_id_fk" FOREIGN KEY ("certificate_id") REFERENCES "public"."certificates"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificate_mails" ADD CONSTRAINT "certificate_mails_outbox_id_mail_outbox_id_fk" FOREIGN KEY ("outbox_id") REFERENCES "public"."mail_outbox"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_signatory_id_user_id_fk" FOREIGN KEY ("signatory_id") REFERENCES "public"."user"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_amends_id_certificates_id_fk" FOREIGN KEY ("amends_id") REFERENCES "public"."certificates"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_superseded_by_id_certificates_id_fk" FOREIGN KEY ("superseded_by_id") REFERENCES "public"."certificates"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "certificate_amendments_new_job_idx" ON "certificate_amendments" USING btree ("new_job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "certificate_amendments_one_open_idx" ON "certificate_amendments" USING btree ("certificate_id") WHERE "certificate_amendments"."status" = 'open';--> statement-breakpoint
CREATE INDEX "certificate_mails_certificate_idx" ON "certificate_mails" USING btree ("certificate_id");--> statement-breakpoint
CREATE UNIQUE INDEX "certificate_mails_outbox_idx" ON "certificate_mails" USING btree ("outbox_id");--> statement-breakpoint
CREATE UNIQUE INDEX "certificates_number_idx" ON "certificates" USING btree ("number");--> statement-breakpoint
CREATE UNIQUE INDEX "certificates_pdf_sha256_idx" ON "certificates" USING btree ("pdf_sha256");--> statement-breakpoint
CREATE INDEX "certificates_customer_idx" ON "certificates" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "certificates_job_idx" ON "certificates" USING btree ("job_id");