CREATE TYPE "public"."report_kind" AS ENUM('point-log', 'model-version', 'settlement-run');--> statement-breakpoint
CREATE TABLE "issued_reports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"kind" "report_kind" NOT NULL,
	"source_id" uuid NOT NULL,
	"source_version" integer,
	"source_options" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"source_key" text NOT NULL,
	"revision" text NOT NULL,
	"attachment_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"size" integer NOT NULL,
	"filename" text NOT NULL,
	"title" text NOT NULL,
	"subject" text NOT NULL,
	"pages" integer NOT NULL,
	"approved_record" boolean NOT NULL,
	"issued_by" uuid,
	"issued_by_name" text NOT NULL,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "issued_reports" ADD CONSTRAINT "issued_reports_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD CONSTRAINT "issued_reports_attachment_id_attachments_id_fk" FOREIGN KEY ("attachment_id") REFERENCES "public"."attachments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD CONSTRAINT "issued_reports_issued_by_users_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "issued_reports_revision_idx" ON "issued_reports" USING btree ("project_id","kind","source_key","revision");--> statement-breakpoint
CREATE INDEX "issued_reports_project_idx" ON "issued_reports" USING btree ("project_id","issued_at");--> statement-breakpoint
CREATE INDEX "issued_reports_attachment_idx" ON "issued_reports" USING btree ("attachment_id");