import { bigserial, doublePrecision, index, integer, pgTable, real, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { runs } from './runs'

/**
 * What each finished run cost on the worker that ran it: the observations the resource estimate calibrates
 * its speed by, per kernel class (server/modules/estimates/speed-calibration.ts). Rows outlive their run (the
 * speed stays a fact about the machine), and only the newest few per class are read.
 */
export const runCosts = pgTable(
  'run_costs',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    runId: uuid('run_id').references(() => runs.id, { onDelete: 'set null' }),
    /** kernelKey() of shared/physics/kernel-class.ts: "engine/path/threads". */
    kernel: text('kernel').notNull(),
    engine: text('engine').notNull(),
    path: text('path').notNull(),
    threads: integer('threads').notNull(),
    /** Node-steps of the run and its error-estimate companion together. */
    cellUpdates: doublePrecision('cell_updates').notNull(),
    /** Envelopes per cell over the plain scheme's three (a multi-wave run does more work per cell-update). */
    envelopeRatio: real('envelope_ratio').notNull().default(1),
    wallS: doublePrecision('wall_s').notNull(),
    /** CPU time of the run's own solver thread (null where the system does not give it). */
    cpuS: doublePrecision('cpu_s'),
    /** One-minute load average when the run ended. */
    loadAvg: real('load_avg'),
    host: text('host').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('run_costs_kernel_created_idx').on(t.kernel, t.createdAt)],
)
