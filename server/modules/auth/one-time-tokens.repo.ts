import { and, eq, gt, isNull, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { emailConfirmations, passwordResets } from '../../db/schema'
import { hashSecretToken, newSecretToken } from './secret-token'

/** Both tables have the same shape: user, token hash, expiry, used-at. */
type OneTimeTable = typeof emailConfirmations | typeof passwordResets

/** A new single-use token for the user; only its hash is stored. */
export async function issueOneTimeToken(db: Db, table: OneTimeTable, userId: string, ttlMs: number): Promise<string> {
  const { token, hash } = newSecretToken()
  const t = table as typeof passwordResets
  await db.insert(t).values({ userId, tokenHash: hash, expiresAt: new Date(Date.now() + ttlMs) })
  return token
}

/**
 * Marks the token used and returns its user, in one statement so two clicks cannot both succeed;
 * null for an unknown, used or expired token.
 */
export async function consumeOneTimeToken(db: Db, table: OneTimeTable, token: string): Promise<string | null> {
  const t = table as typeof passwordResets
  const [row] = await db
    .update(t)
    .set({ usedAt: sql`now()` })
    .where(and(eq(t.tokenHash, hashSecretToken(token)), isNull(t.usedAt), gt(t.expiresAt, sql`now()`)))
    .returning({ userId: t.userId })
  return row?.userId ?? null
}

/** Makes the user's other outstanding tokens of this kind useless (after one was used). */
export async function spendAllTokens(db: Db, table: OneTimeTable, userId: string): Promise<void> {
  const t = table as typeof passwordResets
  await db.update(t).set({ usedAt: sql`now()` }).where(and(eq(t.userId, userId), isNull(t.usedAt)))
}

/** Like consumeOneTimeToken for e-mail confirmations, with the new address a change link carries. */
export async function consumeEmailConfirmation(db: Db, token: string): Promise<{ userId: string; newEmail: string | null } | null> {
  const t = emailConfirmations
  const [row] = await db
    .update(t)
    .set({ usedAt: sql`now()` })
    .where(and(eq(t.tokenHash, hashSecretToken(token)), isNull(t.usedAt), gt(t.expiresAt, sql`now()`)))
    .returning({ userId: t.userId, newEmail: t.newEmail })
  return row ?? null
}

/** A confirmation link for a change of address; only its hash and the address are stored. */
export async function issueEmailChangeToken(db: Db, userId: string, newEmail: string, ttlMs: number): Promise<string> {
  const { token, hash } = newSecretToken()
  await db.insert(emailConfirmations).values({ userId, tokenHash: hash, newEmail, expiresAt: new Date(Date.now() + ttlMs) })
  return token
}
