import { and, eq, gt, isNull, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { sessions, users } from '../../db/schema'
import { isUuid } from '../../policy/ids'

export interface ActiveSession {
  sessionId: string
  createdAt: Date
  expiresAt: Date
  user: { id: string; email: string; isAdmin: boolean }
}

export async function createSession(db: Db, userId: string, expiresAt: Date, userAgent?: string): Promise<{ id: string; createdAt: Date }> {
  const [row] = await db
    .insert(sessions)
    .values({ userId, expiresAt, userAgent: userAgent?.slice(0, 300) })
    .returning({ id: sessions.id, createdAt: sessions.createdAt })
  return row
}

/** The session and its user, when the row exists, is not revoked and has not expired. */
export async function findActiveSession(db: Db, sessionId: string, userId: string): Promise<ActiveSession | null> {
  if (!isUuid(sessionId) || !isUuid(userId)) return null
  const [row] = await db
    .select({
      sessionId: sessions.id,
      createdAt: sessions.createdAt,
      expiresAt: sessions.expiresAt,
      user: { id: users.id, email: users.email, isAdmin: users.isAdmin },
    })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, sessionId), eq(sessions.userId, userId), isNull(sessions.revokedAt), gt(sessions.expiresAt, sql`now()`)))
  return row ?? null
}

export async function extendSession(db: Db, sessionId: string, expiresAt: Date): Promise<void> {
  await db.update(sessions).set({ expiresAt }).where(eq(sessions.id, sessionId))
}

export async function revokeSession(db: Db, sessionId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: sql`now()` }).where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)))
}

/** Ends every session of a user (after a password reset). */
export async function revokeAllSessions(db: Db, userId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: sql`now()` }).where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)))
}
