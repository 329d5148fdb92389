CREATE TABLE "run_costs" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"run_id" uuid,
	"kernel" text NOT NULL,
	"engine" text NOT NULL,
	"path" text NOT NULL,
	"threads" integer NOT NULL,
	"cell_updates" double precision NOT NULL,
	"envelope_ratio" real DEFAULT 1 NOT NULL,
	"wall_s" double precision NOT NULL,
	"cpu_s" double precision,
	"load_avg" real,
	"host" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "run_costs" ADD CONSTRAINT "run_costs_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_costs_kernel_created_idx" ON "run_costs" USING btree ("kernel","created_at");