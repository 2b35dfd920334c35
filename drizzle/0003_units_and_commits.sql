ALTER TABLE "formula_revisions" ADD COLUMN "git_date" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "formula_revisions" ADD COLUMN "git_message" text;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "unit_system" text DEFAULT 'metric' NOT NULL;