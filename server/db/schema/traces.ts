import { doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { TraceColumn, TraceImportSettings, TraceSignalInfo } from '@shared/api/traces'
import { groups } from './groups'
import { bytea } from './run-arrays'
import { users } from './users'

export const traceFormat = pgEnum('trace_format', ['delimited', 'npy'])

/**
 * A measured trace a group member uploaded: the file exactly as sent (downloadable byte for byte) and the
 * arrays parsed from it with the member's choices. One row, one insert: an upload is stored whole or not at all.
 * List queries must name their columns; the byte columns are large.
 */
export const traces = pgTable(
  'traces',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    name: text('name').notNull(),
    notes: text('notes').notNull().default(''),
    fileName: text('file_name').notNull(),
    contentType: text('content_type').notNull(),
    byteSize: integer('byte_size').notNull(),
    sha256: text('sha256').notNull(),
    format: traceFormat('format').notNull(),
    original: bytea('original').notNull(),
    settings: jsonb('settings').$type<TraceImportSettings>().notNull(),
    /** Every column the parser found (names and unit hints), for reopening the import choices. */
    columns: jsonb('columns').$type<TraceColumn[]>().notNull(),
    signals: jsonb('signals').$type<TraceSignalInfo[]>().notNull(),
    sampleCount: integer('sample_count').notNull(),
    startNs: doublePrecision('start_ns').notNull(),
    endNs: doublePrecision('end_ns').notNull(),
    /** Little-endian float64 [sampleCount]. */
    timeNs: bytea('time_ns').notNull(),
    /** Little-endian float64 [signals.length, sampleCount], in the signal unit, baseline removed. */
    signalData: bytea('signal_data').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('traces_group_created_idx').on(t.groupId, t.createdAt)],
)

export type TraceRow = typeof traces.$inferSelect
export type NewTraceRow = typeof traces.$inferInsert
