import { and, desc, eq, gt, isNull, lt, or, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { apiTokens, users } from '../../db/schema'
import { isUuid } from '../../policy/ids'

export interface TokenOwner {
  tokenId: string
  user: { id: string; email: string; isAdmin: boolean }
}

/** The live token with this hash and its owner; revoked and expired tokens count as absent. */
export async function findLiveToken(db: Db, tokenHash: string): Promise<TokenOwner | null> {
  const [row] = await db
    .select({ tokenId: apiTokens.id, user: { id: users.id, email: users.email, isAdmin: users.isAdmin } })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(and(eq(apiTokens.tokenHash, tokenHash), isNull(apiTokens.revokedAt), or(isNull(apiTokens.expiresAt), gt(apiTokens.expiresAt, sql`now()`))))
  return row ?? null
}

// Written at most once a minute per token, so a busy script does not turn every read into a write.
export async function touchToken(db: Db, tokenId: string): Promise<void> {
  await db
    .update(apiTokens)
    .set({ lastUsedAt: sql`now()` })
    .where(and(eq(apiTokens.id, tokenId), or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, sql`now() - interval '1 minute'`))))
}

export async function insertToken(db: Db, row: { userId: string; name: string; tokenHash: string; tokenPrefix: string; expiresAt: Date | null }) {
  const [token] = await db.insert(apiTokens).values(row).returning()
  return token
}

export async function listTokens(db: Db, userId: string) {
  return db.select().from(apiTokens).where(eq(apiTokens.userId, userId)).orderBy(desc(apiTokens.createdAt))
}

/** Revokes one of the user's own tokens; false when there is no such token of theirs. */
export async function revokeToken(db: Db, userId: string, tokenId: string): Promise<boolean> {
  if (!isUuid(tokenId)) return false
  const [row] = await db
    .update(apiTokens)
    .set({ revokedAt: sql`coalesce(${apiTokens.revokedAt}, now())` })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId)))
    .returning({ id: apiTokens.id })
  return row !== undefined
}
