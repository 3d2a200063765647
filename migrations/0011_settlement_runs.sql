CREATE TYPE "public"."settlement_run_status" AS ENUM('queued', 'running', 'finished', 'failed');--> statement-breakpoint
CREATE TABLE "settlement_run_points" (
	"run_id" uuid NOT NULL,
	"index" integer NOT NULL,
	"detail" jsonb NOT NULL,
	CONSTRAINT "settlement_run_points_run_id_index_pk" PRIMARY KEY("run_id","index")
);
--> statement-breakpoint
CREATE TABLE "settlement_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"model" jsonb NOT NULL,
	"definition" jsonb NOT NULL,
	"loads" jsonb NOT NULL,
	"points" jsonb NOT NULL,
	"grid" jsonb,
	"options" jsonb NOT NULL,
	"status" "settlement_run_status" DEFAULT 'queued' NOT NULL,
	"progress" real DEFAULT 0 NOT NULL,
	"error_message" text,
	"error_code" text,
	"attempts" integer DEFAULT 0 NOT NULL,
	"results" jsonb,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "settlement_run_points" ADD CONSTRAINT "settlement_run_points_run_id_settlement_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."settlement_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "settlement_runs" ADD CONSTRAINT "settlement_runs_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "settlement_runs" ADD CONSTRAINT "settlement_runs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "settlement_runs_project_idx" ON "settlement_runs" USING btree ("project_id","created_at");--> statement-breakpoint
CREATE INDEX "settlement_runs_status_idx" ON "settlement_runs" USING btree ("status");