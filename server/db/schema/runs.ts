import { sql } from 'drizzle-orm'
import { index, integer, jsonb, type AnyPgColumn, pgEnum, pgTable, real, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { RunManifest } from '../../../solver/index'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'
import type { ResourceEstimate } from '@shared/physics/resource-estimate'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { groups } from './groups'
import { sweeps } from './sweeps'
import { users } from './users'

export const runStatus = pgEnum('run_status', ['queued', 'running', 'succeeded', 'failed', 'cancelled'])

/** One simulation a group member submitted; the row is the source of truth for its state, not pg-boss. */
export const runs = pgTable(
  'runs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    // Runs outlive their author's account; the group keeps them.
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    title: text('title').notNull(),
    notes: text('notes').notNull().default(''),
    config: jsonb('config').$type<SimulationConfig>().notNull(),
    /** sha256 of the canonical JSON of the parsed config: equal configs, equal hash. */
    configHash: text('config_hash').notNull(),
    solverVersion: text('solver_version').notNull(),
    status: runStatus('status').notNull().default('queued'),
    progress: real('progress').notNull().default(0),
    /** Incremented each time a worker takes the run; results and map blocks are keyed by it. */
    attempt: integer('attempt').notNull().default(0),
    error: text('error'),
    heartbeatAt: timestamp('heartbeat_at', { withTimezone: true }),
    workerId: text('worker_id'),
    /** The pg-boss job currently carrying the run. */
    jobId: uuid('job_id'),
    idempotencyKey: text('idempotency_key'),
    estimate: jsonb('estimate').$type<ResourceEstimate>(),
    figures: jsonb('figures').$type<FiguresOfMerit>(),
    manifest: jsonb('manifest').$type<RunManifest>(),
    /** Set when the run is a point of a parameter sweep (server/modules/sweeps); null for single runs. */
    sweepId: uuid('sweep_id').references((): AnyPgColumn => sweeps.id, { onDelete: 'cascade' }),
    /** The point's index in its sweep; a re-run adds a newer run with the same index. */
    sweepPoint: integer('sweep_point'),
    /**
     * A single run's place in its author's line when it was queued (server/jobs/fair-priority.ts): its job's
     * pg-boss priority is minus this, so the runs of whoever has fewest in flight are fetched first.
     */
    queueRank: integer('queue_rank').notNull().default(0),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('runs_group_created_idx').on(t.groupId, t.createdAt),
    // The watchdog's scan: running rows by heartbeat age.
    index('runs_status_heartbeat_idx').on(t.status, t.heartbeatAt),
    index('runs_sweep_point_idx').on(t.sweepId, t.sweepPoint),
    // The quota checks: an author's runs of the last day, and those in flight.
    index('runs_author_created_idx').on(t.authorId, t.createdAt),
    uniqueIndex('runs_author_idempotency_key').on(t.authorId, t.idempotencyKey).where(sql`${t.idempotencyKey} is not null`),
  ],
)

export type Run = typeof runs.$inferSelect
export type NewRun = typeof runs.$inferInsert
