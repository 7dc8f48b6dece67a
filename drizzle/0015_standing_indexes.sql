CREATE INDEX "bids_accepted_shop_idx" ON "bids" USING btree ("shop_id","decided_at") WHERE "bids"."status" = 'accepted';--> statement-breakpoint
CREATE INDEX "jobs_builder_awarded_idx" ON "jobs" USING btree ("builder_id") WHERE "jobs"."awarded_bid_id" IS NOT NULL;--> statement-breakpoint
CREATE INDEX "disputes_job_idx" ON "disputes" USING btree ("job_id");