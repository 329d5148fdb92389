import { integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core'

/** Worker processes, for the queue view: each refreshes its row with its heartbeat. */
export const workers = pgTable('workers', {
  id: text('id').primaryKey(),
  host: text('host').notNull(),
  pid: integer('pid').notNull(),
  threads: integer('threads').notNull(),
  busy: integer('busy').notNull().default(0),
  startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
  lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull().defaultNow(),
})
