ALTER TABLE "fits" ADD COLUMN "attempt" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "fits" ADD COLUMN "heartbeat_at" timestamp with time zone;