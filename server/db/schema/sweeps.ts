import { boolean, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { SweepAxis, SweepEstimate } from '@shared/api/sweeps'
import { groups } from './groups'
import { users } from './users'

export const sweepStatus = pgEnum('sweep_status', ['running', 'finished', 'cancelled'])

/**
 * A parameter sweep: a base configuration and its axes. Each point is a run (runs.sweep_id, runs.sweep_point);
 * a re-run adds a newer run for the same point, and the newest run of a point is the one that counts.
 */
export const sweeps = pgTable(
  'sweeps',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    title: text('title').notNull(),
    notes: text('notes').notNull().default(''),
    baseConfig: jsonb('base_config').$type<SimulationConfig>().notNull(),
    axes: jsonb('axes').$type<SweepAxis[]>().notNull(),
    /** Points' windows lengthen to hold their pulses (shared/physics/sweep-window.ts); kept so a re-run builds the same point. */
    extendWindow: boolean('extend_window').notNull().default(true),
    pointCount: integer('point_count').notNull(),
    estimate: jsonb('estimate').$type<SweepEstimate>().notNull(),
    /** running until no point is queued or running; the feeder (server/modules/sweeps/sweep-feeder.ts) closes it. */
    status: sweepStatus('status').notNull().default('running'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
    /** Set once the finished mail went out (or was skipped), so it is sent once across processes. */
    notifiedAt: timestamp('notified_at', { withTimezone: true }),
    /** When the feeder last handed a point of this sweep to the queue: the round-robin order across sweeps. */
    lastFedAt: timestamp('last_fed_at', { withTimezone: true }),
  },
  (t) => [index('sweeps_group_created_idx').on(t.groupId, t.createdAt), index('sweeps_status_idx').on(t.status)],
)

export type Sweep = typeof sweeps.$inferSelect
export type NewSweep = typeof sweeps.$inferInsert
