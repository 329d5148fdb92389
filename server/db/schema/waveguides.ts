import { sql } from 'drizzle-orm'
import { index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { Waveguide } from '@shared/physics/waveguide'
import { groups } from './groups'
import { users } from './users'

/**
 * A group's own waveguide. `params` is a parsed shared Waveguide (validated before every write);
 * its `name` is kept equal to the `name` column, which carries the case-insensitive uniqueness.
 */
export const waveguides = pgTable(
  'waveguides',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    params: jsonb('params').$type<Waveguide>().notNull(),
    notes: text('notes').notNull().default(''),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('waveguides_group_name_lower_key').on(t.groupId, sql`lower(${t.name})`),
    index('waveguides_group_updated_idx').on(t.groupId, t.updatedAt),
  ],
)

export type WaveguideRow = typeof waveguides.$inferSelect
export type NewWaveguideRow = typeof waveguides.$inferInsert
