ALTER TABLE "users" ADD COLUMN "notify_on_sweep_finish" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "notify_on_group_change" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "email_confirmations" ADD COLUMN "new_email" text;