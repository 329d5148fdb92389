import { sql } from 'drizzle-orm'
import { boolean, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'

export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    // Stored as typed; uniqueness ignores case so Ingrid@ and ingrid@ are one account.
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    emailConfirmedAt: timestamp('email_confirmed_at', { withTimezone: true }),
    isAdmin: boolean('is_admin').notNull().default(false),
    /** Mail me when a single run of mine finishes (opt-out); sweeps have their own setting below. */
    notifyOnFinish: boolean('notify_on_finish').notNull().default(true),
    /** Mail me one digest when a sweep of mine finishes (its points send none of their own). */
    notifyOnSweepFinish: boolean('notify_on_sweep_finish').notNull().default(true),
    /** Mail me when I am invited to a group or my role in one changes. */
    notifyOnGroupChange: boolean('notify_on_group_change').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('users_email_lower_key').on(sql`lower(${t.email})`)],
)

export type User = typeof users.$inferSelect
export type NewUser = typeof users.$inferInsert
