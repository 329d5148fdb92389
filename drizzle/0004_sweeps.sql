CREATE TYPE "public"."sweep_status" AS ENUM('running', 'finished', 'cancelled');--> statement-breakpoint
CREATE TABLE "sweeps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"group_id" uuid NOT NULL,
	"author_id" uuid,
	"title" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"base_config" jsonb NOT NULL,
	"axes" jsonb NOT NULL,
	"point_count" integer NOT NULL,
	"estimate" jsonb NOT NULL,
	"status" "sweep_status" DEFAULT 'running' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone,
	"notified_at" timestamp with time zone,
	"last_fed_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "sweep_id" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "sweep_point" integer;--> statement-breakpoint
ALTER TABLE "sweeps" ADD CONSTRAINT "sweeps_group_id_groups_id_fk" FOREIGN KEY ("group_id") REFERENCES "public"."groups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sweeps" ADD CONSTRAINT "sweeps_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "sweeps_group_created_idx" ON "sweeps" USING btree ("group_id","created_at");--> statement-breakpoint
CREATE INDEX "sweeps_status_idx" ON "sweeps" USING btree ("status");--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_sweep_id_sweeps_id_fk" FOREIGN KEY ("sweep_id") REFERENCES "public"."sweeps"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "runs_sweep_point_idx" ON "runs" USING btree ("sweep_id","sweep_point");