ALTER TABLE "runs" ADD COLUMN "queue_rank" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX "runs_author_created_idx" ON "runs" USING btree ("author_id","created_at");