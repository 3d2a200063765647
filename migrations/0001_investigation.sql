CREATE TYPE "public"."groundwater_kind" AS ENUM('strike', 'standing', 'piezometer');--> statement-breakpoint
CREATE TYPE "public"."point_kind" AS ENUM('borehole', 'cpt', 'test-pit', 'piezometer');--> statement-breakpoint
CREATE TYPE "public"."sample_type" AS ENUM('thin-walled-tube', 'piston', 'block', 'bulk', 'spt-split-spoon', 'core');--> statement-breakpoint
CREATE TABLE "cpt_soundings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"area_ratio" double precision NOT NULL,
	"count" integer NOT NULL,
	"depth" double precision[] NOT NULL,
	"qc" double precision[] NOT NULL,
	"fs" double precision[] NOT NULL,
	"u2" double precision[] NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "groundwater_observations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"kind" "groundwater_kind" NOT NULL,
	"observed_at" timestamp with time zone NOT NULL,
	"depth" double precision,
	"pressure" double precision,
	"remarks" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "groundwater_depth_or_pressure" CHECK ("groundwater_observations"."depth" is not null or "groundwater_observations"."pressure" is not null)
);
--> statement-breakpoint
CREATE TABLE "import_mappings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"target" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"saved_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "index_tests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sample_id" uuid NOT NULL,
	"water_content" double precision,
	"liquid_limit" double precision,
	"plastic_limit" double precision,
	"bulk_unit_weight" double precision,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "investigation_points" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"identifier" text NOT NULL,
	"kind" "point_kind" NOT NULL,
	"easting" double precision NOT NULL,
	"northing" double precision NOT NULL,
	"ground_elevation" double precision NOT NULL,
	"final_depth" double precision NOT NULL,
	"started_on" date,
	"ended_on" date,
	"method" text DEFAULT '' NOT NULL,
	"logged_by" text DEFAULT '' NOT NULL,
	"remarks" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "investigation_points_final_depth_positive" CHECK ("investigation_points"."final_depth" > 0)
);
--> statement-breakpoint
CREATE TABLE "log_intervals" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"top" double precision NOT NULL,
	"bottom" double precision NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"uscs" text,
	"stratum_id" uuid,
	"moisture" text,
	"consistency" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "log_intervals_top_above_bottom" CHECK ("log_intervals"."top" >= 0 and "log_intervals"."bottom" > "log_intervals"."top")
);
--> statement-breakpoint
CREATE TABLE "samples" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"identifier" text NOT NULL,
	"top" double precision NOT NULL,
	"bottom" double precision NOT NULL,
	"type" "sample_type" NOT NULL,
	"recovery" double precision,
	"remarks" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "samples_top_above_bottom" CHECK ("samples"."top" >= 0 and "samples"."bottom" >= "samples"."top")
);
--> statement-breakpoint
CREATE TABLE "spt_results" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"depth" double precision NOT NULL,
	"blows" integer[] NOT NULL,
	"n" integer NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "strata" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"colour" text NOT NULL,
	"pattern" text NOT NULL,
	"unit_weight" double precision NOT NULL,
	"unit_weight_saturated" double precision NOT NULL,
	"display_order" integer DEFAULT 0 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "vane_readings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"point_id" uuid NOT NULL,
	"depth" double precision NOT NULL,
	"peak" double precision NOT NULL,
	"remoulded" double precision,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "cpt_soundings" ADD CONSTRAINT "cpt_soundings_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "groundwater_observations" ADD CONSTRAINT "groundwater_observations_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_mappings" ADD CONSTRAINT "import_mappings_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_mappings" ADD CONSTRAINT "import_mappings_saved_by_users_id_fk" FOREIGN KEY ("saved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "index_tests" ADD CONSTRAINT "index_tests_sample_id_samples_id_fk" FOREIGN KEY ("sample_id") REFERENCES "public"."samples"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "investigation_points" ADD CONSTRAINT "investigation_points_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_intervals" ADD CONSTRAINT "log_intervals_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_intervals" ADD CONSTRAINT "log_intervals_stratum_id_strata_id_fk" FOREIGN KEY ("stratum_id") REFERENCES "public"."strata"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "samples" ADD CONSTRAINT "samples_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spt_results" ADD CONSTRAINT "spt_results_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strata" ADD CONSTRAINT "strata_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vane_readings" ADD CONSTRAINT "vane_readings_point_id_investigation_points_id_fk" FOREIGN KEY ("point_id") REFERENCES "public"."investigation_points"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "cpt_soundings_point_idx" ON "cpt_soundings" USING btree ("point_id");--> statement-breakpoint
CREATE INDEX "groundwater_point_idx" ON "groundwater_observations" USING btree ("point_id","observed_at");--> statement-breakpoint
CREATE UNIQUE INDEX "import_mappings_project_target_idx" ON "import_mappings" USING btree ("project_id","target");--> statement-breakpoint
CREATE UNIQUE INDEX "index_tests_sample_idx" ON "index_tests" USING btree ("sample_id");--> statement-breakpoint
CREATE UNIQUE INDEX "investigation_points_project_identifier_idx" ON "investigation_points" USING btree ("project_id","identifier");--> statement-breakpoint
CREATE INDEX "log_intervals_point_idx" ON "log_intervals" USING btree ("point_id","top");--> statement-breakpoint
CREATE UNIQUE INDEX "samples_point_identifier_idx" ON "samples" USING btree ("point_id","identifier");--> statement-breakpoint
CREATE INDEX "spt_results_point_idx" ON "spt_results" USING btree ("point_id","depth");--> statement-breakpoint
CREATE UNIQUE INDEX "strata_project_code_idx" ON "strata" USING btree ("project_id","code");--> statement-breakpoint
CREATE INDEX "vane_readings_point_idx" ON "vane_readings" USING btree ("point_id","depth");