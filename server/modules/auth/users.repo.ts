import { eq, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { users, type User } from '../../db/schema'
import { isUuid } from '../../policy/ids'

/** Addresses match without regard to case (the users_email_lower_key index does the same). */
export async function findUserByEmail(db: Db, email: string): Promise<User | null> {
  const [user] = await db.select().from(users).where(sql`lower(${users.email}) = lower(${email})`)
  return user ?? null
}

export async function findUserById(db: Db, id: string): Promise<User | null> {
  if (!isUuid(id)) return null
  const [user] = await db.select().from(users).where(eq(users.id, id))
  return user ?? null
}

/** Inserts a user, or returns null when the address is taken (also when a concurrent sign-up won). */
export async function insertUser(db: Db, row: { email: string; name: string; passwordHash: string }): Promise<User | null> {
  const [user] = await db.insert(users).values(row).onConflictDoNothing().returning()
  return user ?? null
}

export async function updateUser(db: Db, id: string, patch: Partial<Pick<User, 'name' | 'notifyOnFinish' | 'notifyOnSweepFinish' | 'notifyOnGroupChange' | 'passwordHash' | 'emailConfirmedAt' | 'isAdmin'>>): Promise<User> {
  const [user] = await db.update(users).set(patch).where(eq(users.id, id)).returning()
  return user
}

export async function markEmailConfirmed(db: Db, id: string): Promise<void> {
  await db.update(users).set({ emailConfirmedAt: sql`coalesce(${users.emailConfirmedAt}, now())` }).where(eq(users.id, id))
}
