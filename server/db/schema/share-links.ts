import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { groups } from './groups'
import { users } from './users'

/**
 * A read-only link to one resource (a run, a sweep, ...). Generic over resource types: the type is
 * a registered name and the group is copied from the resource when the link is made, so a deleted
 * group takes its links with it.
 */
export const shareLinks = pgTable(
  'share_links',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    resourceType: text('resource_type').notNull(),
    resourceId: uuid('resource_id').notNull(),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    /** true: anyone with the link; false: anyone signed in with the link. */
    public: boolean('public').notNull().default(false),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [index('share_links_resource_idx').on(t.resourceType, t.resourceId)],
)

export type ShareLink = typeof shareLinks.$inferSelect
