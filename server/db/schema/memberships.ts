import { index, pgEnum, pgTable, primaryKey, timestamp, uuid } from 'drizzle-orm/pg-core'
import { groups } from './groups'
import { users } from './users'

export const membershipRole = pgEnum('membership_role', ['owner', 'editor', 'viewer'])

export const memberships = pgTable(
  'memberships',
  {
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    groupId: uuid('group_id')
      .notNull()
      .references(() => groups.id, { onDelete: 'cascade' }),
    role: membershipRole('role').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  // The primary key serves "groups of a user"; the index serves "members of a group".
  (t) => [primaryKey({ columns: [t.userId, t.groupId] }), index('memberships_group_id_idx').on(t.groupId)],
)

export type Membership = typeof memberships.$inferSelect
export type MembershipRole = (typeof membershipRole.enumValues)[number]
