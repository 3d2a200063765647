ALTER TABLE "spt_results" ADD COLUMN "penetrations" integer[];--> statement-breakpoint
ALTER TABLE "spt_results" ADD COLUMN "seating" integer;