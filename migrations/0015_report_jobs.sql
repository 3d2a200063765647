CREATE TYPE "public"."report_stage" AS ENUM('gathering', 'drawing', 'writing', 'storing');--> statement-breakpoint
CREATE TYPE "public"."report_status" AS ENUM('queued', 'running', 'issued', 'failed');--> statement-breakpoint
ALTER TABLE "issued_reports" ALTER COLUMN "attachment_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ALTER COLUMN "sha256" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ALTER COLUMN "size" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ALTER COLUMN "pages" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "status" "report_status" DEFAULT 'issued' NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "stage" "report_stage";--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "progress" real DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "attempts" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "error_message" text;--> statement-breakpoint
ALTER TABLE "issued_reports" ADD COLUMN "error_code" text;--> statement-breakpoint
CREATE INDEX "issued_reports_status_idx" ON "issued_reports" USING btree ("status");