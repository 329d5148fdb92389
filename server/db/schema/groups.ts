import { pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'

/** A research group's shared workspace. */
export const groups = pgTable('groups', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
})

export type Group = typeof groups.$inferSelect
export type NewGroup = typeof groups.$inferInsert
