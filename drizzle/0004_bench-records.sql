CREATE TABLE "bench_records" (
	"id" serial PRIMARY KEY NOT NULL,
	"plan_date" text NOT NULL,
	"target" text NOT NULL,
	"kind" text NOT NULL,
	"formula_id" text,
	"formulas" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"mixer" text,
	"label" text NOT NULL,
	"dough_temperature" double precision,
	"water_temperature" double precision,
	"ripe" boolean,
	"note" text DEFAULT '' NOT NULL,
	"initials" text NOT NULL,
	"recorded_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone NOT NULL,
	"user_id" integer,
	"by_email" text NOT NULL,
	"by_name" text DEFAULT '' NOT NULL,
	"client_id" text,
	"corrects" integer,
	"sheet_inputs" json,
	"hidden_at" timestamp with time zone,
	"hidden_by" text,
	"hidden_reason" text
);
--> statement-breakpoint
CREATE TABLE "photo_blobs" (
	"key" text PRIMARY KEY NOT NULL,
	"data" "bytea" NOT NULL
);
--> statement-breakpoint
CREATE TABLE "record_photos" (
	"id" serial PRIMARY KEY NOT NULL,
	"record_id" integer NOT NULL,
	"n" integer NOT NULL,
	"content_type" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"preview_bytes" integer NOT NULL,
	"storage" text NOT NULL,
	"key" text NOT NULL,
	"preview_key" text NOT NULL,
	"created_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
ALTER TABLE "bench_records" ADD CONSTRAINT "bench_records_corrects_bench_records_id_fk" FOREIGN KEY ("corrects") REFERENCES "public"."bench_records"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "record_photos" ADD CONSTRAINT "record_photos_record_id_bench_records_id_fk" FOREIGN KEY ("record_id") REFERENCES "public"."bench_records"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "bench_records_date_idx" ON "bench_records" USING btree ("plan_date");--> statement-breakpoint
CREATE INDEX "bench_records_formula_idx" ON "bench_records" USING btree ("formula_id");--> statement-breakpoint
CREATE INDEX "bench_records_corrects_idx" ON "bench_records" USING btree ("corrects");--> statement-breakpoint
CREATE UNIQUE INDEX "bench_records_client_id_idx" ON "bench_records" USING btree ("client_id");--> statement-breakpoint
CREATE UNIQUE INDEX "record_photos_record_n_idx" ON "record_photos" USING btree ("record_id","n");