ALTER TABLE "api_tokens" ADD COLUMN "scope" text DEFAULT 'read-write' NOT NULL;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD COLUMN "expires_at" timestamp with time zone DEFAULT now() + interval '90 days' NOT NULL;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_scope_known" CHECK ("api_tokens"."scope" in ('read-write', 'read-only'));