ALTER TABLE "inspection_records" ALTER COLUMN "status" SET DATA TYPE text;--> statement-breakpoint
ALTER TABLE "inspection_records" ALTER COLUMN "status" SET DEFAULT 'submitted'::text;--> statement-breakpoint
DROP TYPE "public"."inspection_status";--> statement-breakpoint
CREATE TYPE "public"."inspection_status" AS ENUM('submitted', 'accepted', 'rejected');--> statement-breakpoint
ALTER TABLE "inspection_records" ALTER COLUMN "status" SET DEFAULT 'submitted'::"public"."inspection_status";--> statement-breakpoint
ALTER TABLE "inspection_records" ALTER COLUMN "status" SET DATA TYPE "public"."inspection_status" USING "status"::"public"."inspection_status";