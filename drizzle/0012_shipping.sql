ALTER TYPE "public"."milestone_kind" ADD VALUE 'sent_to_shop';--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "receiving_address" jsonb;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "return_address" jsonb;