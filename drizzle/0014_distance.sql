-- Added by hand: drizzle-kit cannot declare PostgreSQL extensions. ll_to_earth, earth_box and earth_distance
-- (the GiST indexes below and the board's and directory's distance filters) come from these two contrib modules.
CREATE EXTENSION IF NOT EXISTS cube;--> statement-breakpoint
CREATE EXTENSION IF NOT EXISTS earthdistance;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "postal_code" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "latitude" double precision;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "longitude" double precision;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "postal_code" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "latitude" double precision;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "longitude" double precision;--> statement-breakpoint
CREATE INDEX "shops_earth_idx" ON "shops" USING gist (ll_to_earth("latitude", "longitude"));--> statement-breakpoint
CREATE INDEX "jobs_open_earth_idx" ON "jobs" USING gist (ll_to_earth("latitude", "longitude")) WHERE "jobs"."status" = 'open';--> statement-breakpoint
CREATE INDEX "jobs_open_unplaced_region_idx" ON "jobs" USING btree (lower("country"),lower("region")) WHERE "jobs"."status" = 'open' AND "jobs"."latitude" IS NULL;