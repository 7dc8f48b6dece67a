CREATE TYPE "public"."bid_status" AS ENUM('active', 'withdrawn', 'accepted', 'declined');--> statement-breakpoint
CREATE TYPE "public"."job_status" AS ENUM('draft', 'open', 'awarded', 'funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved', 'cancelled');--> statement-breakpoint
CREATE TABLE "bid_line_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"bid_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"operation" text,
	"description" text NOT NULL,
	"quantity" integer NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"amount_cents" integer NOT NULL,
	CONSTRAINT "bid_line_items_amount_check" CHECK ("bid_line_items"."amount_cents" = "bid_line_items"."quantity" * "bid_line_items"."unit_price_cents")
);
--> statement-breakpoint
CREATE TABLE "bid_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"bid_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"total_cents" integer NOT NULL,
	"turnaround_days" integer NOT NULL,
	"valid_until" date NOT NULL,
	"note" text NOT NULL,
	"line_items" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "bids" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"shop_id" uuid NOT NULL,
	"status" "bid_status" DEFAULT 'active' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"total_cents" integer NOT NULL,
	"turnaround_days" integer NOT NULL,
	"valid_until" date NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"job_revision" integer NOT NULL,
	"decided_at" timestamp with time zone,
	"decline_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "bids_total_check" CHECK ("bids"."total_cents" >= 0)
);
--> statement-breakpoint
CREATE TABLE "job_photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"uploaded_by" uuid NOT NULL,
	"storage_key" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"position" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"builder_id" uuid NOT NULL,
	"status" "job_status" DEFAULT 'draft' NOT NULL,
	"title" text NOT NULL,
	"engine_family" text NOT NULL,
	"cylinders" integer NOT NULL,
	"block_material" text NOT NULL,
	"operations" text[] NOT NULL,
	"logistics" text NOT NULL,
	"country" text NOT NULL,
	"region" text NOT NULL,
	"city" text NOT NULL,
	"needed_by" date NOT NULL,
	"spec" jsonb NOT NULL,
	"bid_count" integer DEFAULT 0 NOT NULL,
	"awarded_bid_id" uuid,
	"revision" integer DEFAULT 1 NOT NULL,
	"published_at" timestamp with time zone,
	"cancelled_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "jobs_cylinders_check" CHECK ("jobs"."cylinders" BETWEEN 1 AND 16),
	CONSTRAINT "jobs_bid_count_check" CHECK ("jobs"."bid_count" >= 0)
);
--> statement-breakpoint
CREATE TABLE "shop_rates" (
	"shop_id" uuid NOT NULL,
	"operation" text NOT NULL,
	"price_cents" integer NOT NULL,
	CONSTRAINT "shop_rates_shop_id_operation_pk" PRIMARY KEY("shop_id","operation"),
	CONSTRAINT "shop_rates_price_check" CHECK ("shop_rates"."price_cents" >= 0)
);
--> statement-breakpoint
CREATE TABLE "shops" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"name" text NOT NULL,
	"country" text NOT NULL,
	"region" text NOT NULL,
	"city" text NOT NULL,
	"takes_shipped" boolean NOT NULL,
	"capabilities" text[] NOT NULL,
	"equipment_notes" text DEFAULT '' NOT NULL,
	"turnaround_days" integer NOT NULL,
	"notify_matching_jobs" boolean DEFAULT false NOT NULL,
	"verified_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "bid_line_items" ADD CONSTRAINT "bid_line_items_bid_id_bids_id_fk" FOREIGN KEY ("bid_id") REFERENCES "public"."bids"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bid_revisions" ADD CONSTRAINT "bid_revisions_bid_id_bids_id_fk" FOREIGN KEY ("bid_id") REFERENCES "public"."bids"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bids" ADD CONSTRAINT "bids_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bids" ADD CONSTRAINT "bids_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_photos" ADD CONSTRAINT "job_photos_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_photos" ADD CONSTRAINT "job_photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_builder_id_users_id_fk" FOREIGN KEY ("builder_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_rates" ADD CONSTRAINT "shop_rates_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shops" ADD CONSTRAINT "shops_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "bid_line_items_bid_idx" ON "bid_line_items" USING btree ("bid_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "bid_revisions_version_idx" ON "bid_revisions" USING btree ("bid_id","version");--> statement-breakpoint
CREATE INDEX "bids_job_idx" ON "bids" USING btree ("job_id","status");--> statement-breakpoint
CREATE INDEX "bids_shop_idx" ON "bids" USING btree ("shop_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "bids_one_active_per_shop_idx" ON "bids" USING btree ("job_id","shop_id") WHERE "bids"."status" = 'active';--> statement-breakpoint
CREATE UNIQUE INDEX "bids_one_accepted_per_job_idx" ON "bids" USING btree ("job_id") WHERE "bids"."status" = 'accepted';--> statement-breakpoint
CREATE INDEX "job_photos_job_idx" ON "job_photos" USING btree ("job_id","position");--> statement-breakpoint
CREATE INDEX "jobs_builder_idx" ON "jobs" USING btree ("builder_id","created_at");--> statement-breakpoint
CREATE INDEX "jobs_open_published_idx" ON "jobs" USING btree ("published_at" DESC NULLS FIRST,"id" DESC NULLS FIRST) WHERE "jobs"."status" = 'open';--> statement-breakpoint
CREATE INDEX "jobs_open_needed_idx" ON "jobs" USING btree ("needed_by","id") WHERE "jobs"."status" = 'open';--> statement-breakpoint
CREATE INDEX "jobs_open_bids_idx" ON "jobs" USING btree ("bid_count","published_at" DESC NULLS FIRST,"id" DESC NULLS FIRST) WHERE "jobs"."status" = 'open';--> statement-breakpoint
CREATE INDEX "jobs_open_spec_idx" ON "jobs" USING btree ("block_material","cylinders","country","region") WHERE "jobs"."status" = 'open';--> statement-breakpoint
CREATE INDEX "jobs_operations_idx" ON "jobs" USING gin ("operations");--> statement-breakpoint
CREATE UNIQUE INDEX "shops_user_idx" ON "shops" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "shops_capabilities_idx" ON "shops" USING gin ("capabilities");--> statement-breakpoint
CREATE INDEX "shops_region_idx" ON "shops" USING btree ("country","region");