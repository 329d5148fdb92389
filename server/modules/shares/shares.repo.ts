import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { shareLinks, type ShareLink } from '../../db/schema'
import { isUuid } from '../../policy/ids'

export async function insertShareLink(db: Db, row: typeof shareLinks.$inferInsert): Promise<ShareLink> {
  const [link] = await db.insert(shareLinks).values(row).returning()
  return link
}

export async function listShareLinks(db: Db, resourceType: string, resourceId: string): Promise<ShareLink[]> {
  return db
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.resourceType, resourceType), eq(shareLinks.resourceId, resourceId)))
    .orderBy(desc(shareLinks.createdAt))
}

export async function findShareLink(db: Db, id: string): Promise<ShareLink | null> {
  if (!isUuid(id)) return null
  const [link] = await db.select().from(shareLinks).where(eq(shareLinks.id, id))
  return link ?? null
}

export async function findLiveShareByHash(db: Db, tokenHash: string, resourceType: string, resourceId: string): Promise<ShareLink | null> {
  if (!isUuid(resourceId)) return null
  const [link] = await db
    .select()
    .from(shareLinks)
    .where(
      and(
        eq(shareLinks.tokenHash, tokenHash),
        eq(shareLinks.resourceType, resourceType),
        eq(shareLinks.resourceId, resourceId),
        isNull(shareLinks.revokedAt),
      ),
    )
  return link ?? null
}

export async function revokeShareLink(db: Db, id: string): Promise<ShareLink> {
  const [link] = await db
    .update(shareLinks)
    .set({ revokedAt: sql`coalesce(${shareLinks.revokedAt}, now())` })
    .where(eq(shareLinks.id, id))
    .returning()
  return link
}
