import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { users } from './users'

/** A mailed link proving the user reads the address they signed up with. Only the hash is kept. */
export const emailConfirmations = pgTable(
  'email_confirmations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    /** Set for a change of address: confirming the token moves the account to this address. */
    newEmail: text('new_email'),
  },
  (t) => [index('email_confirmations_user_id_idx').on(t.userId)],
)

export type EmailConfirmation = typeof emailConfirmations.$inferSelect
