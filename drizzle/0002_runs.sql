CREATE TYPE "public"."run_status" AS ENUM('queued', 'running', 'succeeded', 'failed', 'cancelled');--> statement-breakpoint
CREATE TYPE "public"."array_dtype" AS ENUM('c16', 'f8', 'f4');--> statement-breakpoint
CREATE TABLE "runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"group_id" uuid NOT NULL,
	"author_id" uuid,
	"title" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"config" jsonb NOT NULL,
	"config_hash" text NOT NULL,
	"solver_version" text NOT NULL,
	"status" "run_status" DEFAULT 'queued' NOT NULL,
	"progress" real DEFAULT 0 NOT NULL,
	"attempt" integer DEFAULT 0 NOT NULL,
	"error" text,
	"heartbeat_at" timestamp with time zone,
	"worker_id" text,
	"job_id" uuid,
	"idempotency_key" text,
	"estimate" jsonb,
	"figures" jsonb,
	"manifest" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "run_arrays" (
	"run_id" uuid NOT NULL,
	"attempt" integer NOT NULL,
	"name" text NOT NULL,
	"dtype" "array_dtype" NOT NULL,
	"shape" jsonb NOT NULL,
	"units" text NOT NULL,
	"description" text NOT NULL,
	"data" "bytea" NOT NULL,
	CONSTRAINT "run_arrays_run_id_attempt_name_pk" PRIMARY KEY("run_id","attempt","name")
);
--> statement-breakpoint
CREATE TABLE "run_map_blocks" (
	"run_id" uuid NOT NULL,
	"attempt" integer NOT NULL,
	"block_index" integer NOT NULL,
	"row_start" integer NOT NULL,
	"row_count" integer NOT NULL,
	"cols" integer NOT NULL,
	"pump_power_w" "bytea" NOT NULL,
	"stokes_power_w" "bytea" NOT NULL,
	"acoustic_phonons_per_m" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_map_blocks_run_id_attempt_block_index_pk" PRIMARY KEY("run_id","attempt","block_index")
);
--> statement-breakpoint
CREATE TABLE "run_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"run_id" uuid NOT NULL,
	"attempt" integer NOT NULL,
	"kind" text NOT NULL,
	"payload" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "workers" (
	"id" text PRIMARY KEY NOT NULL,
	"host" text NOT NULL,
	"pid" integer NOT NULL,
	"threads" integer NOT NULL,
	"busy" integer DEFAULT 0 NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_seen_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_group_id_groups_id_fk" FOREIGN KEY ("group_id") REFERENCES "public"."groups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_arrays" ADD CONSTRAINT "run_arrays_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_map_blocks" ADD CONSTRAINT "run_map_blocks_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_events" ADD CONSTRAINT "run_events_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "runs_group_created_idx" ON "runs" USING btree ("group_id","created_at");--> statement-breakpoint
CREATE INDEX "runs_status_heartbeat_idx" ON "runs" USING btree ("status","heartbeat_at");--> statement-breakpoint
CREATE UNIQUE INDEX "runs_author_idempotency_key" ON "runs" USING btree ("author_id","idempotency_key") WHERE "runs"."idempotency_key" is not null;--> statement-breakpoint
CREATE INDEX "run_events_run_id_idx" ON "run_events" USING btree ("run_id","id");