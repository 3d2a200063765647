CREATE TYPE "public"."us_stress_unit" AS ENUM('psf', 'tsf');--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "us_stress_unit" "us_stress_unit" DEFAULT 'psf' NOT NULL;