CREATE TABLE "login_throttle" (
	"key" text PRIMARY KEY NOT NULL,
	"attempts" integer NOT NULL,
	"window_start" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
DROP TABLE "login_attempts" CASCADE;--> statement-breakpoint
CREATE INDEX "login_throttle_window_idx" ON "login_throttle" USING btree ("window_start");