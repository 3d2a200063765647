CREATE TYPE "public"."oedometer_test_type" AS ENUM('incremental', 'crs');--> statement-breakpoint
CREATE TYPE "public"."stage_convention" AS ENUM('void-ratio', 'strain', 'dial');--> statement-breakpoint
CREATE TYPE "public"."attachment_owner" AS ENUM('project', 'point', 'sample', 'test');--> statement-breakpoint
CREATE TYPE "public"."model_version_status" AS ENUM('saved', 'submitted', 'approved', 'returned');--> statement-breakpoint
CREATE TYPE "public"."flag_status" AS ENUM('open', 'resolved');--> statement-breakpoint
CREATE TYPE "public"."flag_target" AS ENUM('preconsolidation-point', 'oedometer-test', 'log-interval', 'cpt-point', 'vane-reading');--> statement-breakpoint
CREATE TYPE "public"."flag_verdict" AS ENUM('questionable', 'exclude', 'accepted');--> statement-breakpoint
CREATE TABLE "oedometer_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sample_id" uuid NOT NULL,
	"label" text NOT NULL,
	"test_type" "oedometer_test_type" NOT NULL,
	"specimen_height" double precision NOT NULL,
	"initial_water_content" double precision,
	"specific_gravity" double precision,
	"e0" double precision NOT NULL,
	"convention" "stage_convention" NOT NULL,
	"stages" jsonb NOT NULL,
	"remarks" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "preconsolidation_adoptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"oedometer_test_id" uuid NOT NULL,
	"method" text NOT NULL,
	"value" double precision NOT NULL,
	"reason" text NOT NULL,
	"delta_e_over_e_0" double precision,
	"quality_class" text,
	"effective_stress" double precision,
	"adopted_by" uuid,
	"adopted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"superseded_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"owner_type" "attachment_owner" NOT NULL,
	"owner_id" uuid,
	"filename" text NOT NULL,
	"content_type" text NOT NULL,
	"size" integer NOT NULL,
	"sha256" text NOT NULL,
	"object_key" text NOT NULL,
	"thumbnail_key" text,
	"caption" text DEFAULT '' NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site_model_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"model_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"definition" jsonb NOT NULL,
	"message" text NOT NULL,
	"status" "model_version_status" DEFAULT 'saved' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site_models" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"draft" jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"based_on" integer,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_flags" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"target_type" "flag_target" NOT NULL,
	"target_id" text NOT NULL,
	"verdict" "flag_verdict" NOT NULL,
	"comment" text NOT NULL,
	"status" "flag_status" DEFAULT 'open' NOT NULL,
	"created_by" uuid,
	"resolved_by" uuid,
	"resolved_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_replies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"flag_id" uuid NOT NULL,
	"body" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "oedometer_tests" ADD CONSTRAINT "oedometer_tests_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "preconsolidation_adoptions" ADD CONSTRAINT "preconsolidation_adoptions_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "preconsolidation_adoptions" ADD CONSTRAINT "preconsolidation_adoptions_oedometer_test_id_oedometer_tests_id_fk" FOREIGN KEY ("oedometer_test_id") REFERENCES "public"."oedometer_tests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "preconsolidation_adoptions" ADD CONSTRAINT "preconsolidation_adoptions_adopted_by_users_id_fk" FOREIGN KEY ("adopted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_model_versions" ADD CONSTRAINT "site_model_versions_model_id_site_models_id_fk" FOREIGN KEY ("model_id") REFERENCES "public"."site_models"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_model_versions" ADD CONSTRAINT "site_model_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_models" ADD CONSTRAINT "site_models_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_models" ADD CONSTRAINT "site_models_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_flags" ADD CONSTRAINT "review_flags_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_flags" ADD CONSTRAINT "review_flags_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_flags" ADD CONSTRAINT "review_flags_resolved_by_users_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_replies" ADD CONSTRAINT "review_replies_flag_id_review_flags_id_fk" FOREIGN KEY ("flag_id") REFERENCES "public"."review_flags"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_replies" ADD CONSTRAINT "review_replies_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "oedometer_tests_sample_idx" ON "oedometer_tests" USING btree ("sample_id");--> statement-breakpoint
CREATE INDEX "preconsolidation_adoptions_test_idx" ON "preconsolidation_adoptions" USING btree ("oedometer_test_id","adopted_at");--> statement-breakpoint
CREATE INDEX "preconsolidation_adoptions_project_idx" ON "preconsolidation_adoptions" USING btree ("project_id");--> statement-breakpoint
CREATE INDEX "attachments_owner_idx" ON "attachments" USING btree ("project_id","owner_type","owner_id");--> statement-breakpoint
CREATE UNIQUE INDEX "site_model_versions_model_version_idx" ON "site_model_versions" USING btree ("model_id","version");--> statement-breakpoint
CREATE INDEX "site_model_versions_model_idx" ON "site_model_versions" USING btree ("model_id");--> statement-breakpoint
CREATE UNIQUE INDEX "site_models_project_name_idx" ON "site_models" USING btree ("project_id","name");--> statement-breakpoint
CREATE INDEX "review_flags_project_idx" ON "review_flags" USING btree ("project_id","status");--> statement-breakpoint
CREATE INDEX "review_flags_target_idx" ON "review_flags" USING btree ("target_type","target_id");--> statement-breakpoint
CREATE INDEX "review_replies_flag_idx" ON "review_replies" USING btree ("flag_id","created_at");