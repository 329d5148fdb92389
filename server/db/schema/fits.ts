import { index, integer, jsonb, pgEnum, pgTable, real, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { FitRequest, FitResult } from '@shared/api/fits'
import { groups } from './groups'
import { runs } from './runs'
import { traces } from './traces'
import { users } from './users'

export const fitStatus = pgEnum('fit_status', ['queued', 'running', 'succeeded', 'failed'])

/** A fit of a run's model to a measured trace, kept with its inputs so it can be reopened. */
export const fits = pgTable(
  'fits',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    traceId: uuid('trace_id')
      .notNull()
      .references(() => traces.id, { onDelete: 'cascade' }),
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    inputs: jsonb('inputs').$type<FitRequest>().notNull(),
    status: fitStatus('status').notNull().default('queued'),
    progress: real('progress').notNull().default(0),
    /** What the fit is doing now ("evaluation 12 of about 40"). */
    message: text('message').notNull().default(''),
    result: jsonb('result').$type<FitResult>(),
    error: text('error'),
    jobId: uuid('job_id'),
    /** Times a worker has taken the fit; a lost worker's fit is handed back until the queue's retry limit. */
    attempt: integer('attempt').notNull().default(0),
    /** Refreshed by the worker while the fit runs; the watchdog hands back a fit whose heartbeat stopped. */
    heartbeatAt: timestamp('heartbeat_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('fits_trace_idx').on(t.traceId, t.createdAt), index('fits_run_idx').on(t.runId, t.createdAt)],
)

export type FitRow = typeof fits.$inferSelect
