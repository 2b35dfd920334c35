ALTER TABLE "formula_revisions" ALTER COLUMN "content" SET DATA TYPE json;--> statement-breakpoint
ALTER TABLE "formulas" ALTER COLUMN "content" SET DATA TYPE json;--> statement-breakpoint
ALTER TABLE "plans" ALTER COLUMN "content" SET DATA TYPE json;